/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The contest director's desk against the built server and PostgreSQL: hold, release and waive
// with a reason, each stored, audited, pushed to the tile and (hold, release) e-mailed to the
// entrant; only a director may act; an entry's timeline and the board's detail of one entry;
// the audit page's filters and the CSV exports.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, todayIn, type GridWorld } from '../../../support/grid'
import { auditRows } from '../../../support/entries'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let ready: string
let unpaid: string
let otherEntrantEntry: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Director Desk Cup')
  ready = await gridEntry(w, { compId: 'R1' })
  unpaid = await gridEntry(w, { compId: 'U1' })
  await testDb()('entries').where({ id: unpaid }).update({ payment_status: 'unpaid' })
  otherEntrantEntry = await gridEntry(w, { compId: 'O1' })
  await testDb()('entries').where({ id: otherEntrantEntry }).update({ entrant_user_id: w.otherEntrant.user.id })
  await testDb()('memberships').insert({ user_id: w.otherEntrant.user.id, competition_id: w.competitionId, role: 'entrant' }).onConflict(['user_id', 'competition_id', 'role']).ignore()
  await openToday(w)
  for (const id of [ready, unpaid]) expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id))).status).toBe(201)
})

const tile = async (entryId: string) => (await w.director.client.get(`${w.base}/board`)).body.tiles.find((t: any) => t.entryId === entryId)
const hold = (entryId: string, body: unknown, client = w.director.client) => client.post(`${w.base}/entries/${entryId}/hold`, body)
const release = (entryId: string, body: unknown, client = w.director.client) => client.post(`${w.base}/entries/${entryId}/release`, body)
const waive = (entryId: string, body: unknown, client = w.director.client) => client.post(`${w.base}/entries/${entryId}/waivers`, body)

describe('who may act', () => {
  it('refuses everyone but a director: 403 for other staff and entrants, 404 for outsiders, 401 signed out', async () => {
    for (const c of [w.scrutineer.client, w.organiser.client, w.admin.client, w.entrant.client]) {
      expect((await hold(ready, { reason: 'Canopy lock sticks' }, c)).status).toBe(403)
      expect((await release(ready, { reason: 'Fixed now' }, c)).status).toBe(403)
      expect((await waive(unpaid, { scope: 'day', checkId: 'entry.paid', reason: 'Paid in cash' }, c)).status).toBe(403)
    }
    expect((await hold(ready, { reason: 'Canopy lock sticks' }, w.outsider.client)).status).toBe(404)
    expect((await hold(ready, { reason: 'Canopy lock sticks' }, w.anonymous)).status).toBe(401)
    expect(await testDb()('director_actions').where({ competition_id: w.competitionId })).toEqual([])
  })

  it('needs a reason for a hold, a release and a waiver', async () => {
    for (const res of [
      await hold(ready, {}),
      await hold(ready, { reason: '  ' }),
      await release(ready, { reason: '' }),
      await waive(unpaid, { scope: 'day', checkId: 'entry.paid' }),
    ]) {
      expect(res.status).toBe(400)
      expect(res.body.data.fieldErrors.reason[0]).toMatch(/reason/)
    }
    const scope = await waive(unpaid, { scope: 'season', checkId: 'entry.paid', reason: 'Paid in cash' })
    expect(scope.status).toBe(400)
    expect(scope.body.data.fieldErrors.scope[0]).toMatch(/day or for the whole competition/)
    expect((await hold('00000000-0000-4000-8000-000000000000', { reason: 'No such glider' })).status).toBe(404)
  })
})

describe('hold and release', () => {
  it('holds a ready glider: stored, audited, on its tile, e-mailed; a second hold is refused', async () => {
    expect((await tile(ready)).readiness).toBe('ready')
    const res = await hold(ready, { reason: 'Canopy lock does not engage fully' })
    expect(res.status).toBe(201)
    expect(res.body.action).toMatchObject({ kind: 'hold', day: todayIn(), scope: null, reason: 'Canopy lock does not engage fully', actor: { id: w.director.user.id, name: 'Dana Director' } })
    expect(res.body.tile).toMatchObject({ readiness: 'held', headline: { kind: 'hold', text: 'Canopy lock does not engage fully' }, hold: { by: 'Dana Director' } })
    expect(await tile(ready)).toMatchObject({ readiness: 'held' })
    const audited = await auditRows(ready, 'director.hold')
    expect(audited).toHaveLength(1)
    expect(audited[0]).toMatchObject({ actor_user_id: w.director.user.id, competition_id: w.competitionId })
    const mail = await testDb()('mail_outbox').where({ entry_id: ready, template: 'director-hold' })
    expect(mail).toHaveLength(1)
    expect(mail[0].to_address).toBe(w.entrant.email)
    expect(mail[0].text_body).toContain('Canopy lock does not engage fully')
    expect(mail[0].text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${w.competitionId}/entries/${ready}`)
    // The director's hold is its own message: no second "held" e-mail from the board.
    expect(await testDb()('mail_outbox').where({ entry_id: ready, template: 'board-held' })).toHaveLength(0)

    const twice = await hold(ready, { reason: 'Again' })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/holds that glider already/)
  })

  it('releases it: back to ready, audited, e-mailed; a release without a hold is refused', async () => {
    const res = await release(ready, { reason: 'Lock adjusted and checked by the scrutineer' })
    expect(res.status).toBe(201)
    expect(res.body.tile).toMatchObject({ readiness: 'ready', hold: null, headline: null })
    expect(await auditRows(ready, 'director.release')).toHaveLength(1)
    const mail = await testDb()('mail_outbox').where({ entry_id: ready, template: 'director-release' })
    expect(mail).toHaveLength(1)
    expect(mail[0].text_body).toContain('may launch once it is ready')
    expect(mail[0].text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${w.competitionId}/entries/${ready}`)
    const again = await release(ready, { reason: 'Again' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/waiver/)
  })

  it('a release does not lift a blocking finding: the glider stays held and the e-mail says why', async () => {
    expect((await tile(unpaid)).readiness).toBe('held')
    expect((await hold(unpaid, { reason: 'See the office' })).status).toBe(201)
    const res = await release(unpaid, { reason: 'Spoke to the pilot' })
    expect(res.body.tile.readiness).toBe('held')
    expect(res.body.tile.headline.checkId).toBe('entry.paid')
    const mail = await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'director-release' })
    expect(mail.at(-1).text_body).toMatch(/still held by a finding/)
  })
})

describe('waivers', () => {
  it('refuses a waiver of a finding the entry does not have', async () => {
    const res = await waive(ready, { scope: 'day', checkId: 'entry.paid', reason: 'Paid in cash' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/not open on this entry/)
  })

  it('waives a blocking finding for the day: the tile counts it waived and the glider is ready', async () => {
    const res = await waive(unpaid, { scope: 'day', checkId: 'entry.paid', subject: 'payment', reason: 'Paid in cash at the office' })
    expect(res.status).toBe(201)
    expect(res.body.action).toMatchObject({ kind: 'waiver', scope: 'day', day: todayIn(), checkId: 'entry.paid', subject: 'payment', finding: { severity: 'blocking' } })
    expect(res.body.tile).toMatchObject({ readiness: 'ready', counts: { blocking: 0, waived: 1 } })
    const audited = await auditRows(unpaid, 'director.waiver')
    expect(audited[0].details).toMatchObject({ scope: 'day', checkId: 'entry.paid', reason: 'Paid in cash at the office', severity: 'blocking' })

    const detail = await w.scrutineer.client.get(`${w.base}/board/entries/${unpaid}`)
    expect(detail.status).toBe(200)
    expect(detail.body.canDirect).toBe(false)
    expect(detail.body.findings.find((f: any) => f.checkId === 'entry.paid').waiver).toMatchObject({ scope: 'day', reason: 'Paid in cash at the office', by: 'Dana Director' })
    expect(detail.body.actions.map((a: any) => a.kind)).toEqual(['hold', 'release', 'waiver'])
    expect((await w.director.client.get(`${w.base}/board/entries/${unpaid}`)).body.canDirect).toBe(true)
    expect((await w.entrant.client.get(`${w.base}/board/entries/${unpaid}`)).status).toBe(403)
  })

  it('waives for the whole competition: stored without a day', async () => {
    const id = await gridEntry(w, { compId: 'U2' })
    await testDb()('entries').where({ id }).update({ payment_status: 'unpaid' })
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id))).status).toBe(201)
    const res = await waive(id, { scope: 'competition', checkId: 'entry.paid', reason: 'Fee waived by the organiser' })
    expect(res.status).toBe(201)
    expect(res.body.action).toMatchObject({ scope: 'competition', day: null })
    expect(res.body.tile.readiness).toBe('ready')
    expect((await testDb()('director_actions').where({ id: res.body.action.id }).first()).day).toBeNull()
  })
})

describe('the phone’s day pack', () => {
  it('carries the director’s actions of the day, so the phone’s readiness counts them', async () => {
    const pack = await w.scrutineer.client.get(`${w.base}/grid/pack`)
    expect(pack.status).toBe(200)
    const entry = pack.body.entries.find((e: any) => e.dossier.entry.id === unpaid)
    expect(entry.directorActions.map((a: any) => a.kind)).toEqual(['hold', 'release', 'waiver'])
    expect(entry.directorActions[2]).toMatchObject({ kind: 'waiver', day: todayIn(), checkId: 'entry.paid', subject: 'payment', reason: 'Paid in cash at the office' })
    expect(pack.body.entries.find((e: any) => e.dossier.entry.id === otherEntrantEntry).directorActions).toEqual([])
  })
})

describe('the entry on today’s board', () => {
  it('its entrant reads its readiness, why and the hold; another entrant learns nothing', async () => {
    const res = await w.entrant.client.get(`${w.base}/entries/${unpaid}/readiness`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ day: { day: todayIn(), status: 'open' }, readiness: 'ready', hold: null, lastCheck: { name: 'Sam Scrutineer' } })
    expect((await w.otherEntrant.client.get(`${w.base}/entries/${unpaid}/readiness`)).status).toBe(404)
    expect((await w.otherEntrant.client.get(`${w.base}/entries/${otherEntrantEntry}/readiness`)).body).toMatchObject({ readiness: 'unchecked', lastCheck: null })
  })
})

describe('an entry’s timeline', () => {
  it('lists grid checks, holds, releases and waivers with who and when, newest first', async () => {
    const res = await w.entrant.client.get(`${w.base}/entries/${unpaid}/timeline`)
    expect(res.status).toBe(200)
    expect(res.body.compId).toBe('U1')
    const kinds = res.body.items.map((i: any) => i.kind)
    expect(kinds).toEqual(['waiver', 'release', 'hold', 'grid-check'])
    expect(res.body.items[0]).toMatchObject({ day: todayIn(), actor: { name: 'Dana Director' }, summary: `Waived entry.paid for ${todayIn()}: Paid in cash at the office` })
    expect(res.body.items[3]).toMatchObject({ actor: { name: 'Sam Scrutineer' } })
    expect(res.body.items[3].summary).toMatch(/^Grid check: passed; held — blocking: entry\.paid/)
    const times = res.body.items.map((i: any) => Date.parse(i.at))
    expect([...times].sort((a, b) => b - a)).toEqual(times)
    // Another entrant learns nothing; staff read it.
    expect((await w.otherEntrant.client.get(`${w.base}/entries/${unpaid}/timeline`)).status).toBe(404)
    expect((await w.scrutineer.client.get(`${w.base}/entries/${unpaid}/timeline`)).status).toBe(200)
  })
})

describe('the audit page', () => {
  it('filters by entry, actor, action and day, and pages back', async () => {
    const all = await w.director.client.get(`${w.base}/audit`)
    expect(all.status).toBe(200)
    expect(all.body.actions).toEqual(expect.arrayContaining(['day.opened', 'grid-check.recorded', 'director.hold', 'director.release', 'director.waiver']))
    expect(all.body.actors.map((a: any) => a.name)).toEqual(expect.arrayContaining(['Dana Director', 'Sam Scrutineer']))

    const byEntry = await w.organiser.client.get(`${w.base}/audit?entryId=${unpaid}`)
    expect(byEntry.body.rows.every((r: any) => r.entry?.id === unpaid)).toBe(true)
    expect(byEntry.body.rows.map((r: any) => r.action)).toEqual(expect.arrayContaining(['director.waiver', 'director.release', 'director.hold', 'grid-check.recorded']))
    expect(byEntry.body.rows[0].entry.compId).toBe('U1')

    const holds = await w.director.client.get(`${w.base}/audit?action=director.hold&actorId=${w.director.user.id}`)
    expect(holds.body.rows.map((r: any) => r.entry.compId).sort()).toEqual(['R1', 'U1'])
    const today = await w.director.client.get(`${w.base}/audit?day=${todayIn()}&action=director.waiver`)
    expect(today.body.rows).toHaveLength(2)
    const otherDay = await w.director.client.get(`${w.base}/audit?day=2027-01-01&action=director.waiver`)
    expect(otherDay.body.rows).toHaveLength(0)

    const first = await w.director.client.get(`${w.base}/audit?limit=2`)
    expect(first.body.rows).toHaveLength(2)
    const second = await w.director.client.get(`${w.base}/audit?limit=2&before=${encodeURIComponent(first.body.nextBefore)}`)
    expect(second.status).toBe(200)
    expect(second.body.rows.map((r: any) => r.id)).not.toContain(first.body.rows[1].id)
    expect(Date.parse(second.body.rows[0].at)).toBeLessThanOrEqual(Date.parse(first.body.rows[1].at))
  })

  it('is for the organiser and the director only; bad filters answered in words', async () => {
    expect((await w.scrutineer.client.get(`${w.base}/audit`)).status).toBe(403)
    expect((await w.entrant.client.get(`${w.base}/audit`)).status).toBe(403)
    const bad = await w.director.client.get(`${w.base}/audit?limit=5000&entryId=nope`)
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fieldErrors).sort()).toEqual(['entryId', 'limit'])
  })
})

describe('exports', () => {
  it('the scrutineering log lists every grid check with its answers and outcome', async () => {
    const res = await w.scrutineer.client.get(`${w.base}/grid-checks/export.csv`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/scrutineering-log\.csv/)
    const lines = String(res.body).trim().split('\n')
    const checks = await testDb()('grid_checks').where({ competition_id: w.competitionId })
    expect(lines).toHaveLength(checks.length + 1)
    expect(lines[0]).toMatch(/^Day,Checked at,Received at,Competition ID/)
    expect(lines.some(l => l.includes(',U1,') && l.includes('Sam Scrutineer') && l.includes('pass') && l.includes('entry.paid'))).toBe(true)
    const oneDay = await w.scrutineer.client.get(`${w.base}/grid-checks/export.csv?day=2027-01-01`)
    expect(String(oneDay.body).trim().split('\n')).toHaveLength(1)
  })

  it('the day’s readiness has a row per tile', async () => {
    const res = await w.organiser.client.get(`${w.base}/board/export.csv`)
    expect(res.status).toBe(200)
    const lines = String(res.body).trim().split('\n')
    const tiles = (await w.director.client.get(`${w.base}/board`)).body.tiles
    expect(lines).toHaveLength(tiles.length + 1)
    expect(lines.find(l => l.includes(',R1,'))).toMatch(/,Ready,/)
    expect((await w.entrant.client.get(`${w.base}/board/export.csv`)).status).toBe(403)
  })
})
