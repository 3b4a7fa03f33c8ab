/* eslint-disable @typescript-eslint/no-explicit-any -- pushed events are what the tests assert */
// Every kind of dossier change reaches a board that is watching, as it commits: the domain
// function that changed the dossier brings the open day's tiles up to date in its own
// transaction — whether a route, or the payment service's notification, made the change. A
// change to one glider also reaches the gliders that share its competition ID or radio ID. A
// grid check or a director's action changes the board exactly once (one sequence number).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { collisionWarningUnit, flightRecorderUnit } from '../../../support/entries'
import { igcFixture, postForm, tinyPdf } from '../../../support/files'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { payOnFake } from '../../../support/payments'
import { boardSocket, eventsSoFar, joinBoard, openToday, type BoardSocket } from '../../../support/board'

const baseUrl = inject('baseUrl')
const serviceEnv = inject('serviceEnv')

let w: GridWorld
let s: BoardSocket
let a: string
let b: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Dossier Change Cup')
  a = await gridEntry(w, { compId: 'X1' })
  b = await gridEntry(w, { compId: 'X2' })
  await openToday(w)
  s = await boardSocket(baseUrl, w.director.client)
  expect(await joinBoard(s, w.competitionId)).toMatchObject({ ok: true, scope: 'staff' })
})
afterAll(async () => {
  s?.close()
  await closeTestDb()
})

/** The board's last sequence number: every change of a tile takes the next one. */
async function seqNow(): Promise<number> {
  const res = await w.director.client.get(`${w.base}/board/seq`)
  expect(res.status).toBe(200)
  return res.body.seq
}

/** The tile of the entry pushed with a number above `after` that `accept` takes. */
async function pushed(entryId: string, after: number, accept: (tile: any) => boolean = () => true): Promise<any> {
  const e = await s.next('board:tile', x => x.entryId === entryId && x.seq > after && x.tile !== null && accept(x.tile), 5000)
  expect(e.cause).toBe('dossier')
  return e.tile
}

const unitOf = async (entryId: string, kind: string) => testDb()('units').where({ entry_id: entryId, kind }).first()
const units = (entryId: string) => `${w.base}/entries/${entryId}/units`
const headlineCheck = (tile: any) => tile.headline?.checkId ?? null

describe('a dossier change reaches the board as it commits', () => {
  it('an entry’s own fields', async () => {
    const before = await seqNow()
    expect((await w.organiser.client.request('PATCH', `${w.base}/entries/${a}`, { pilotName: 'Hanne Changed' })).status).toBe(200)
    const e = await s.next('board:tile', x => x.entryId === a && x.seq > before)
    expect(e).toMatchObject({ cause: 'dossier', tile: { pilotName: 'Hanne Changed' } })
    // The recorder's declaration follows the pilot (as a new file would), so it stays quiet below.
    await testDb()('igc_files').where({ entry_id: a }).update({ pilot: 'Hanne Changed' })
  })

  it('its units, deleted, added and changed', async () => {
    let before = await seqNow()
    const recorder = await unitOf(a, 'flight-recorder')
    expect((await w.organiser.client.request('DELETE', `${units(a)}/${recorder.id}`)).status).toBeLessThan(300)
    expect(headlineCheck(await pushed(a, before))).toBe('recorder.present')

    // A new recorder has no IGC file yet; the old recorder's file, left tied to no recorder, is
    // named for it: then nothing is open.
    before = await seqNow()
    const added = await w.organiser.client.post(units(a), flightRecorderUnit())
    expect(added.status).toBe(201)
    expect(headlineCheck(await pushed(a, before))).toBe('recorder.igc-file')

    before = await seqNow()
    const loose = await testDb()('igc_files').where({ entry_id: a, superseded: false }).whereNull('unit_id').first('id')
    expect((await w.entrant.client.request('PUT', `${w.base}/entries/${a}/igc-files/${loose.id}/recorder`, { unitId: added.body.id })).status).toBe(200)
    expect(headlineCheck(await pushed(a, before))).toBeNull()

    before = await seqNow()
    const warner = await unitOf(a, 'collision-warning')
    const expiring = collisionWarningUnit({ radioId: warner.radio_id, firmwareExpiresOn: '2027-05-03', firmwareUpdatedOn: '2027-01-10' })
    expect((await w.organiser.client.request('PATCH', `${units(a)}/${warner.id}`, expiring)).status).toBe(200)
    expect(headlineCheck(await pushed(a, before))).toBe('firmware.valid-through-contest')

    before = await seqNow()
    expect((await w.organiser.client.request('PATCH', `${units(a)}/${warner.id}`, { ...expiring, firmwareExpiresOn: '2029-01-31' })).status).toBe(200)
    expect(headlineCheck(await pushed(a, before))).toBeNull()
  })

  it('a glider sharing a radio ID with the changed one is brought up to date too, and so is its end', async () => {
    const mine = await unitOf(a, 'collision-warning')
    const theirs = await unitOf(b, 'collision-warning')
    // The app refuses a radio ID another entry holds; data written behind its back (an import
    // of old records) may still hold one twice. The next change of either glider shows both.
    await testDb()('units').where({ id: theirs.id }).update({ radio_id: mine.radio_id })
    let before = await seqNow()
    expect((await w.organiser.client.request('PATCH', `${w.base}/entries/${b}`, { pilotName: 'Bo Twin' })).status).toBe(200)
    await testDb()('igc_files').where({ entry_id: b }).update({ pilot: 'Bo Twin' })
    expect(headlineCheck(await pushed(b, before))).toBe('radio-id.unique')
    expect(headlineCheck(await pushed(a, before))).toBe('radio-id.unique')

    // The twin's unit goes: the other glider, which held the finding, is cleared as well.
    before = await seqNow()
    expect((await w.organiser.client.request('DELETE', `${units(b)}/${theirs.id}`)).status).toBeLessThan(300)
    expect(headlineCheck(await pushed(a, before))).toBeNull()
    expect((await w.organiser.client.post(units(b), collisionWarningUnit({ radioId: theirs.radio_id, firmwareExpiresOn: '2029-01-31', firmwareUpdatedOn: '2027-01-10' }))).status).toBe(201)
  })

  it('the rules, and a document uploaded and reviewed', async () => {
    let before = await seqNow()
    const rules = await w.organiser.client.request('PATCH', w.base, { rules: { requiredDocumentKinds: ['insurance'] } })
    expect(rules.status).toBe(200)
    expect(headlineCheck(await pushed(a, before))).toBe('documents.required')
    expect(headlineCheck(await pushed(b, before))).toBe('documents.required')

    before = await seqNow()
    const upload = await postForm(w.entrant.client, `${w.base}/entries/${b}/documents`, { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'insurance.pdf', data: tinyPdf(), type: 'application/pdf' })
    expect(upload.status).toBe(201)
    const waiting = await pushed(b, before)
    expect(waiting.headline).toMatchObject({ checkId: 'documents.required' })
    expect(waiting.headline.text).toMatch(/waiting for a scrutineer/)

    before = await seqNow()
    const documentId = (upload.body as any).document.id
    expect((await w.scrutineer.client.post(`${w.base}/documents/${documentId}/review`, { decision: 'accept' })).status).toBe(200)
    expect(headlineCheck(await pushed(b, before))).toBeNull()

    before = await seqNow()
    expect((await w.organiser.client.request('PATCH', w.base, { rules: { requiredDocumentKinds: [] } })).status).toBe(200)
    expect(headlineCheck(await pushed(a, before))).toBeNull()
  })

  it('an IGC file uploaded', async () => {
    const before = await seqNow()
    const recorder = await unitOf(a, 'flight-recorder')
    const res = await postForm(w.entrant.client, `${w.base}/entries/${a}/igc-files`, { unitId: recorder.id }, { name: 'flight.igc', data: igcFixture('valid-declaration.igc') })
    expect(res.status).toBe(201)
    expect(headlineCheck(await pushed(a, before))).toBe('declaration.matches-entry')
  })

  it('a class', async () => {
    const before = await seqNow()
    expect((await w.organiser.client.request('PATCH', `${w.base}/classes/${w.classId}`, { name: 'Standard Renamed' })).status).toBe(200)
    expect((await pushed(b, before)).className).toBe('Standard Renamed')
    expect((await pushed(a, before)).className).toBe('Standard Renamed')
  })

  it('the firmware catalogue', async () => {
    const before = await seqNow()
    const release = { unitFamily: 'Example CW-2', version: '7.20', expiresOn: '2028-06-30' }
    expect((await w.organiser.client.post(`${w.base}/firmware`, release)).status).toBe(201)
    expect((await pushed(b, before, t => t.counts.advisory > 0)).counts.advisory).toBeGreaterThan(0)
  })

  it('a payment the payment service reports', async () => {
    // Unpaid, as the office found out: the next change of the entry puts it on the board.
    await testDb()('entries').where({ id: b }).update({ payment_status: 'unpaid', paid_minor: 0 })
    let before = await seqNow()
    expect((await w.organiser.client.request('PATCH', `${w.base}/entries/${b}`, { pilotName: 'Paula Payer' })).status).toBe(200)
    expect(headlineCheck(await pushed(b, before))).toBe('entry.paid')

    before = await seqNow()
    const checkout = await w.entrant.client.post(`${w.base}/entries/${b}/checkout`)
    expect(checkout.status).toBe(201)
    expect((await payOnFake(serviceEnv, checkout.body.url)).status).toBe(200)
    const paid = await pushed(b, before)
    expect(paid).toMatchObject({ pilotName: 'Paula Payer' })
    expect(headlineCheck(paid)).not.toBe('entry.paid')
  })
})

describe('what changes the board itself changes it once', () => {
  it('a grid check takes one number and pushes one tile', async () => {
    const before = await seqNow()
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(a))
    expect(res.status).toBe(201)
    expect(await seqNow()).toBe(before + 1)
    const tiles = (await eventsSoFar(s, 'board:tile')).filter(e => e.seq > before)
    expect(tiles).toHaveLength(1)
    expect(tiles[0]).toMatchObject({ entryId: a, seq: before + 1, cause: 'grid-check' })
  })

  it('a director’s hold takes one number and pushes one tile', async () => {
    const before = await seqNow()
    expect((await w.director.client.post(`${w.base}/entries/${a}/hold`, { reason: 'Tail dolly left on' })).status).toBe(201)
    expect(await seqNow()).toBe(before + 1)
    const tiles = (await eventsSoFar(s, 'board:tile')).filter(e => e.seq > before)
    expect(tiles).toHaveLength(1)
    expect(tiles[0]).toMatchObject({ entryId: a, seq: before + 1, cause: 'hold', tile: { readiness: 'held' } })
  })
})
