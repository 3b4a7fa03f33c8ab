/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Contest days and the board's snapshot against the built server and PostgreSQL: opening a day
// puts every accepted entry on the board unchecked with its standing findings; grid checks and
// dossier edits change tiles with the next sequence number; closing keeps the day's record;
// who may open, close and read; bad input answered in words.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'
import { auditRows } from '../../../support/entries'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let clean: string
let unpaid: string
let submitted: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Board Days Cup')
  clean = await gridEntry(w, { compId: 'D1' })
  unpaid = await gridEntry(w, { compId: 'D2' })
  await testDb()('entries').where({ id: unpaid }).update({ payment_status: 'unpaid' })
  submitted = await gridEntry(w, { compId: 'D3', status: 'submitted' })
})

async function board(client = w.director.client, query = '') {
  const res = await client.get(`${w.base}/board${query}`)
  expect(res.status).toBe(200)
  return res.body
}
const tileOf = (b: any, entryId: string) => b.tiles.find((t: any) => t.entryId === entryId)

describe('before any day is opened', () => {
  it('the board has no day and no tiles; the days list names today and the scheduled days', async () => {
    const b = await board()
    expect(b).toMatchObject({ day: null, tiles: [], seq: 0, competition: { id: w.competitionId, name: 'Board Days Cup', timeZone: 'Europe/Berlin' } })
    expect(b.classes.map((c: any) => c.id)).toContain(w.classId)
    const days = await w.scrutineer.client.get(`${w.base}/days`)
    expect(days.status).toBe(200)
    expect(days.body).toMatchObject({ today: todayIn(), timeZone: 'Europe/Berlin', days: [], openDay: null })
  })

  it('refuses director actions while no day is open', async () => {
    const res = await w.director.client.post(`${w.base}/entries/${clean}/hold`, { reason: 'Canopy lock sticks' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/No contest day is open/)
  })
})

describe('opening a day', () => {
  it('refuses anyone but the director', async () => {
    for (const c of [w.scrutineer.client, w.organiser.client, w.admin.client, w.entrant.client]) {
      const res = await c.post(`${w.base}/days`, { kind: 'practice' })
      expect(res.status).toBe(403)
      expect(res.body.message).toMatch(/contest director/)
    }
    expect((await w.outsider.client.post(`${w.base}/days`, { kind: 'practice' })).status).toBe(404)
    expect((await w.anonymous.post(`${w.base}/days`, { kind: 'practice' })).status).toBe(401)
  })

  it('answers bad input in words', async () => {
    const noKind = await w.director.client.post(`${w.base}/days`, {})
    expect(noKind.status).toBe(400)
    expect(noKind.body.data.fieldErrors.kind[0]).toMatch(/practice or a contest day/)
    const far = await w.director.client.post(`${w.base}/days`, { day: shiftDay(todayIn(), 30), kind: 'practice' })
    expect(far.status).toBe(400)
    expect(far.body.data.fieldErrors.day[0]).toMatch(/14 days back to tomorrow/)
    const badDate = await w.director.client.post(`${w.base}/days`, { day: '2027-02-30', kind: 'practice' })
    expect(badDate.status).toBe(400)
    expect(badDate.body.data.fieldErrors.day[0]).toMatch(/does not exist/)
    const extra = await w.director.client.post(`${w.base}/days`, { kind: 'practice', open: true })
    expect(extra.status).toBe(400)
    const notJson = await w.director.client.postRaw(`${w.base}/days`, '{"kind":')
    expect(notJson.status).toBe(400)
    expect(await testDb()('board_days').where({ competition_id: w.competitionId })).toEqual([])
  })

  it('puts every accepted entry on the board unchecked, standing findings shown, others left off', async () => {
    const day = await openToday(w)
    expect(day).toMatchObject({ day: todayIn(), kind: 'practice', status: 'open', openedBy: 'Dana Director', closedAt: null })
    const b = await board(w.scrutineer.client)
    expect(b.day.day).toBe(todayIn())
    expect(b.tiles.map((t: any) => t.entryId).sort()).toEqual([clean, unpaid].sort())
    expect(tileOf(b, submitted)).toBeUndefined()
    for (const t of b.tiles) expect(t.readiness).toBe('unchecked')
    expect(tileOf(b, clean)).toMatchObject({ compId: 'D1', classId: w.classId, className: 'Standard', headline: null, lastCheck: null, hold: null, counts: { blocking: 0, advisory: 0, waived: 0 } })
    // The unpaid entry carries its finding over into the day.
    expect(tileOf(b, unpaid).headline).toMatchObject({ kind: 'finding', severity: 'blocking', checkId: 'entry.paid' })
    expect(tileOf(b, unpaid).counts.blocking).toBe(1)
    expect(b.seq).toBeGreaterThanOrEqual(3)
    const audited = await auditRows(todayIn(), 'day.opened')
    expect(audited.find(a => a.competition_id === w.competitionId)?.details).toMatchObject({ day: todayIn(), kind: 'practice', entries: 2 })
  })

  it('answers the open day again when opened twice, and refuses a second open day', async () => {
    const again = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
    expect(again.status).toBe(200)
    expect(again.body.created).toBe(false)
    const other = await w.director.client.post(`${w.base}/days`, { day: shiftDay(todayIn(), -1), kind: 'practice' })
    expect(other.status).toBe(409)
    expect(other.body.message).toContain(todayIn())
  })

  it('lets only staff read the board', async () => {
    expect((await w.organiser.client.get(`${w.base}/board`)).status).toBe(200)
    expect((await w.entrant.client.get(`${w.base}/board`)).status).toBe(403)
    expect((await w.outsider.client.get(`${w.base}/board`)).status).toBe(404)
    expect((await w.anonymous.get(`${w.base}/board`)).status).toBe(401)
    expect((await w.director.client.get(`${w.base}/board?day=2027-13-01`)).status).toBe(400)
    const seq = await w.scrutineer.client.get(`${w.base}/board/seq`)
    expect(seq.body).toEqual({ seq: (await board()).seq, openDay: todayIn() })
  })
})

describe('changes on an open day', () => {
  it('a grid check changes the tile with the next sequence number', async () => {
    const before = await board()
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(clean))
    expect(res.status).toBe(201)
    const after = await board()
    expect(after.seq).toBe(before.seq + 1)
    expect(tileOf(after, clean)).toMatchObject({ readiness: 'ready', seq: after.seq, lastCheck: { initials: 'SS', name: 'Sam Scrutineer', outcome: 'pass' } })
    // The other tile did not change.
    expect(tileOf(after, unpaid)).toEqual(tileOf(before, unpaid))
  })

  it('a grid check of a glider with a blocking finding holds it, and its entrant is e-mailed', async () => {
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(unpaid))
    expect(res.status).toBe(201)
    expect(tileOf(await board(), unpaid).readiness).toBe('held')
    const mail = await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'board-held' })
    expect(mail).toHaveLength(1)
    expect(mail[0].subject).toBe(`D2 is held on ${todayIn()} — Board Days Cup`)
    expect(mail[0].text_body).toMatch(/entry fee/i)
  })

  it('a dossier edit reaches the tile as it commits, and is recorded as a change of findings', async () => {
    const units = await testDb()('units').where({ entry_id: clean, kind: 'flight-recorder' })
    const del = await w.organiser.client.request('DELETE', `${w.base}/entries/${clean}/units/${units[0].id}`)
    expect(del.status).toBeLessThan(300)
    const b = await board()
    expect(tileOf(b, clean)).toMatchObject({ readiness: 'held', headline: { checkId: 'recorder.present', severity: 'blocking' } })
    const changed = await auditRows(clean, 'findings.changed')
    expect(changed.at(-1).details).toMatchObject({ entryId: clean, day: todayIn(), cause: 'dossier', readiness: { from: 'ready', to: 'held' } })
    expect(changed.at(-1).details.added.map((f: any) => f.checkId)).toContain('recorder.present')
    expect(changed.at(-1).actor_user_id).toBe(w.organiser.user.id)
  })

  it('an entry accepted joins the board, and leaves it when withdrawn', async () => {
    const third = await gridEntry(w, { compId: 'D4', status: 'submitted' })
    expect(tileOf(await board(), third)).toBeUndefined()
    expect((await w.organiser.client.post(`${w.base}/entries/${third}/accept`)).status).toBe(200)
    expect(tileOf(await board(), third)).toMatchObject({ compId: 'D4', readiness: 'unchecked' })
    expect((await w.entrant.client.post(`${w.base}/entries/${third}/withdraw`)).status).toBe(200)
    expect(tileOf(await board(), third)).toBeUndefined()
  })
})

describe('closing the day', () => {
  it('keeps the day’s tiles as they ended; the day can be opened again', async () => {
    expect((await w.scrutineer.client.post(`${w.base}/days/${todayIn()}/close`)).status).toBe(403)
    expect((await w.director.client.post(`${w.base}/days/${shiftDay(todayIn(), -3)}/close`)).status).toBe(404)
    expect((await w.director.client.post(`${w.base}/days/not-a-day/close`)).status).toBe(404)
    const before = await board()
    const res = await w.director.client.post(`${w.base}/days/${todayIn()}/close`)
    expect(res.status).toBe(200)
    expect(res.body.day).toMatchObject({ status: 'closed', closedBy: 'Dana Director' })
    expect((await w.director.client.post(`${w.base}/days/${todayIn()}/close`)).status).toBe(409)

    const closed = await board()
    expect(closed.day.status).toBe('closed')
    expect(closed.tiles).toEqual(before.tiles)
    expect(closed.seq).toBe(before.seq + 1)
    // A check on a closed day is stored but changes no tile.
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(clean))).status).toBe(201)
    expect((await board()).tiles).toEqual(before.tiles)
    expect((await w.director.client.post(`${w.base}/entries/${clean}/hold`, { reason: 'Too late' })).status).toBe(409)

    const reopened = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
    expect(reopened.status).toBe(201)
    expect(reopened.body.day.status).toBe('open')
    expect((await auditRows(todayIn(), 'day.reopened')).some(a => a.competition_id === w.competitionId)).toBe(true)
    const list = await w.director.client.get(`${w.base}/days`)
    expect(list.body.days).toHaveLength(1)
    expect(list.body.openDay).toBe(todayIn())
  })
})

describe('a board read again', () => {
  it('is not read from the database again while its number stands, and is as soon as it moves', async () => {
    const f = await gridWorld(baseUrl, 'Board Kept Cup')
    const first = await gridEntry(f, { compId: 'K1' })
    const second = await gridEntry(f, { compId: 'K2' })
    await openToday(f)
    const read = async () => (await f.director.client.get(`${f.base}/board`)).body
    const before = await read()
    expect(before.tiles.map((t: any) => t.compId)).toEqual(['K1', 'K2'])

    // A tile's stored text changed with no number taken — no writer of the board does this; here
    // it tells which read sent the tiles.
    const stored = testDb()('board_tiles').where({ competition_id: f.competitionId, entry_id: second })
    await stored.clone().update({ shown: testDb().raw(`json_build_object('marked', true)::jsonb || shown::jsonb`) })
    const again = await read()
    expect(again.seq).toBe(before.seq)
    expect(again.tiles).toEqual(before.tiles)
    expect(again.generatedAt >= before.generatedAt).toBe(true)

    // A grid check of the other glider takes the next number: the tiles are read afresh.
    const res = await f.scrutineer.client.post(`${f.base}/grid-checks`, checkBody(first))
    expect(res.status).toBe(201)
    const after = await read()
    expect(after.seq).toBe(before.seq + 1)
    expect(after.tiles.find((t: any) => t.entryId === first)).toMatchObject({ readiness: 'ready', seq: after.seq })
    expect(after.tiles.find((t: any) => t.entryId === second).marked).toBe(true)

    // Closing the day changes no tile: the board says it is closed, with the same tiles.
    const closed = await f.director.client.post(`${f.base}/days/${todayIn()}/close`)
    expect(closed.status).toBe(200)
    const afterClose = await read()
    expect(afterClose.day.status).toBe('closed')
    expect(afterClose.tiles).toEqual(after.tiles)
  })
})

describe('a board of a whole field', () => {
  it('comes in board order — classes in their order, competition IDs in number order — and gzipped when asked', async () => {
    const f = await gridWorld(baseUrl, 'Board Field Cup')
    // The Club class is put first; IDs of digits and letters, which a plain text sort misorders.
    await testDb()('classes').where({ id: f.otherClassId }).update({ sort_order: 0 })
    await testDb()('classes').where({ id: f.classId }).update({ sort_order: 1 })
    const standardIds = ['12', '3', 'A10', 'A2', 'B1', '7', '21', 'ZZ', '100', 'A1']
    const clubIds = ['9', '10', 'C2', 'C10', '1', '88', 'C1']
    const rows = [...standardIds.map(c => ({ classId: f.classId, compId: c })), ...clubIds.map(c => ({ classId: f.otherClassId, compId: c }))]
    const fillers = Array.from({ length: 30 - rows.length }, (_, i) => `M${i}`) // enough tiles to be worth gzipping
    rows.push(...fillers.map(c => ({ classId: f.classId, compId: c })))
    await testDb()('entries').insert(rows.map(r => ({
      competition_id: f.competitionId,
      class_id: r.classId,
      entrant_user_id: f.entrant.user.id,
      status: 'accepted',
      payment_status: 'paid',
      pilot_name: `Pilot ${r.compId}`,
      glider_type: 'Tarn 15',
      registration: `D-${r.compId}`,
      comp_id: r.compId,
    })))
    await openToday(f)

    const path = `${f.base}/board`
    const headers = (encoding: string) => ({ 'cookie': f.director.client.cookie, 'x-forwarded-for': f.director.client.address, 'accept': 'application/json', 'accept-encoding': encoding })
    const zipped = await fetch(baseUrl + path, { headers: headers('gzip, deflate, br') })
    expect(zipped.status).toBe(200)
    expect(zipped.headers.get('content-encoding')).toBe('gzip')
    expect(zipped.headers.get('vary')).toMatch(/accept-encoding/i)
    const plain = await fetch(baseUrl + path, { headers: headers('identity') })
    expect(plain.headers.get('content-encoding')).toBeNull()
    // Where its time went (the bench splits the snapshot's time with it), zipped or not; the
    // arrival on the server's clock closes the list.
    for (const res of [zipped, plain]) {
      const timing = res.headers.get('server-timing')!.split(', ').map(p => p.split(';'))
      expect(timing.map(([name]) => name)).toEqual(['auth', 'read', 'zip', 'start'])
      for (const [, dur] of timing.slice(0, -1)) expect(Number(dur!.replace('dur=', ''))).toBeGreaterThanOrEqual(0)
    }
    const zippedBody = await zipped.json() as any // fetch undoes the gzip
    const plainBody = await plain.json() as any
    expect(zippedBody.tiles).toEqual(plainBody.tiles)
    expect(zippedBody.seq).toBe(plainBody.seq)

    const order = zippedBody.tiles.map((t: any) => t.compId)
    const club = ['1', '9', '10', '88', 'C1', 'C2', 'C10']
    const standard = ['3', '7', '12', '21', '100', 'A1', 'A2', 'A10', 'B1', ...fillers, 'ZZ'] // M0 … M9, M10 …
    expect(order).toEqual([...club, ...standard])
    expect(zippedBody.classes.map((c: any) => c.name)).toEqual(['Club', 'Standard'])
    expect(zippedBody.day.day).toBe(todayIn())

    // The organiser moves the Club class after Standard: its tiles move on the board as it commits.
    const moved = await f.organiser.client.request('PATCH', `${f.base}/classes/${f.otherClassId}`, { sortOrder: 5 })
    expect(moved.status).toBe(200)
    const after = (await f.director.client.get(path)).body
    expect(after.tiles.map((t: any) => t.compId)).toEqual([...standard, ...club])
    expect(after.classes.map((c: any) => c.name)).toEqual(['Standard', 'Club'])
    expect(after.seq).toBeGreaterThan(zippedBody.seq)
  })
})
