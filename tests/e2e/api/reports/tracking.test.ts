/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The tracking list through the built server and PostgreSQL: every accepted entry with each
// collision-warning unit's radio ID (an entry with two units gives two lines, one with none a
// line with an empty radio ID), drafts and withdrawn entries left out, as JSON and as CSV safe
// from formula injection; filtered to a day's board; for staff only; a bad filter refused.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { collisionWarningUnit } from '../../../support/entries'
import { gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let twoUnits: string // A1: two collision-warning units
let noUnit: string // B2: none, so its line shows the gap
let lateAccepted: string // E5: accepted after yesterday's board was made
const radioOf: Record<string, string> = {}
const yesterday = () => shiftDay(todayIn(), -1)

const registrationOf = async (id: string) => (await testDb()('entries').where({ id }).first('registration')).registration as string
const json = (query = '', client = w.scrutineer.client) => client.get(`${w.base}/tracking.json${query}`)

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Tracking Cup')
  twoUnits = await gridEntry(w, { compId: 'A1' })
  noUnit = await gridEntry(w, { compId: 'B2' })
  await gridEntry(w, { compId: 'W3', status: 'withdrawn' })
  await gridEntry(w, { compId: 'D4', status: 'draft' })
  lateAccepted = await gridEntry(w, { compId: 'E5', status: 'submitted' })
  // A second unit, added by the office as a pilot's update would be (lower case: stored upper).
  const second = await w.organiser.client.post(`${w.base}/entries/${twoUnits}/units`, collisionWarningUnit({ serial: 'CW-0002', radioId: 'a0b1c2' }))
  expect(second.status).toBe(201)
  await testDb()('units').where({ entry_id: noUnit, kind: 'collision-warning' }).delete()
  radioOf.first = (await testDb()('units').where({ entry_id: twoUnits, kind: 'collision-warning' }).orderBy('created_at').first('radio_id')).radio_id
  // A pilot's name a spreadsheet would run as a formula.
  await testDb()('entries').where({ id: noUnit }).update({ pilot_name: '=HYPERLINK("http://x.example","Bo")' })
})

describe('the list', () => {
  it('gives every accepted entry, one line per collision-warning unit, the gap shown; drafts, submitted and withdrawn left out', async () => {
    const res = await json()
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="tracking-cup-[\w]+-tracking\.json"$/)
    expect(res.body).toMatchObject({ competitionId: w.competitionId, competitionName: 'Tracking Cup', boardDay: null })
    expect(Number.isNaN(Date.parse(res.body.generatedAt))).toBe(false)
    const [regA, regB] = [await registrationOf(twoUnits), await registrationOf(noUnit)]
    expect(res.body.rows).toEqual([
      { entryId: twoUnits, compId: 'A1', registration: regA, gliderType: 'Kestrel Test 15', className: 'Standard', pilotName: 'Erin Entrant', radioId: radioOf.first },
      { entryId: twoUnits, compId: 'A1', registration: regA, gliderType: 'Kestrel Test 15', className: 'Standard', pilotName: 'Erin Entrant', radioId: 'A0B1C2' },
      { entryId: noUnit, compId: 'B2', registration: regB, gliderType: 'Kestrel Test 15', className: 'Standard', pilotName: '=HYPERLINK("http://x.example","Bo")', radioId: null },
    ])
    // Six hex digits, the 24-bit address (ICAO Annex 10 Vol III ch. 9).
    expect(radioOf.first).toMatch(/^[0-9A-F]{6}$/)
  })

  it('writes the same lines as CSV under the documented columns, a formula made harmless', async () => {
    const res = await fetch(`${baseUrl}${w.base}/tracking.csv`, { headers: { cookie: w.director.client.cookie } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8')
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="tracking-cup-[\w]+-tracking\.csv"$/)
    const lines = (await res.text()).trim().split('\n')
    const [regA, regB] = [await registrationOf(twoUnits), await registrationOf(noUnit)]
    expect(lines).toEqual([
      'comp_id,registration,glider_type,class,pilot,radio_id',
      `A1,${regA},Kestrel Test 15,Standard,Erin Entrant,${radioOf.first}`,
      `A1,${regA},Kestrel Test 15,Standard,Erin Entrant,A0B1C2`,
      // csvSafe's apostrophe (OWASP "CSV Injection"), quotes doubled by the CSV writer.
      `B2,${regB},Kestrel Test 15,Standard,"'=HYPERLINK(""http://x.example"",""Bo"")",`,
    ])
  })
})

describe('filtered to a day’s board', () => {
  it('refuses a day whose board was never opened with 404 in words', async () => {
    const res = await json('?board=today')
    expect(res.status).toBe(404)
    expect(res.body.message).toBe(MESSAGES.trackingNoBoard(todayIn()))
  })

  it('keeps only the entries on that day’s board: yesterday’s before a late acceptance, today’s after', async () => {
    const opened = await w.director.client.post(`${w.base}/days`, { day: yesterday(), kind: 'practice' })
    expect(opened.status).toBe(201)
    expect((await w.director.client.post(`${w.base}/days/${yesterday()}/close`)).status).toBe(200)
    // Accepted after yesterday's board was made: on today's, not on yesterday's.
    await testDb()('entries').where({ id: lateAccepted }).update({ status: 'accepted' })
    expect((await w.director.client.post(`${w.base}/days`, { kind: 'practice' })).status).toBe(201)

    const past = await json(`?board=${yesterday()}`)
    expect(past.status).toBe(200)
    expect(past.body.boardDay).toBe(yesterday())
    expect([...new Set(past.body.rows.map((r: any) => r.compId))]).toEqual(['A1', 'B2'])

    const today = await json('?board=today')
    expect(today.status).toBe(200)
    expect(today.body.boardDay).toBe(todayIn())
    expect([...new Set(today.body.rows.map((r: any) => r.compId))]).toEqual(['A1', 'B2', 'E5'])
    expect(today.body.rows.find((r: any) => r.compId === 'E5').radioId).toMatch(/^[0-9A-F]{6}$/)

    const csv = await fetch(`${baseUrl}${w.base}/tracking.csv?board=${yesterday()}`, { headers: { cookie: w.organiser.client.cookie } })
    expect(csv.headers.get('content-disposition')).toContain(`-tracking-${yesterday()}.csv"`)
    expect((await csv.text()).trim().split('\n').map(l => l.split(',')[0])).toEqual(['comp_id', 'A1', 'A1', 'B2'])
  })

  it('refuses a filter that is neither today nor a real date with 400 in words', async () => {
    for (const q of ['?board=yesterday', '?board=', '?board=2027-5-1']) {
      const res = await json(q)
      expect(res.status, q).toBe(400)
      expect(res.body.data.fieldErrors.board[0], q).toBe('Filter by board with board=today or a date as YYYY-MM-DD.')
    }
    const noSuchDay = await json('?board=2027-02-30')
    expect(noSuchDay.status).toBe(400)
    expect(noSuchDay.body.data.fieldErrors.board[0]).toBe('That date does not exist.')
    expect((await w.organiser.client.get(`${w.base}/tracking.csv?board=soon`)).status).toBe(400)
  })
})

describe('who may download it', () => {
  it('lets organisers, scrutineers and the director; refuses an entrant with 403 in words, an outsider 404, anyone signed out 401', async () => {
    for (const c of [w.organiser.client, w.scrutineer.client, w.director.client, w.admin.client]) {
      expect((await json('', c)).status).toBe(200)
    }
    for (const path of ['tracking.json', 'tracking.csv']) {
      const entrant = await w.entrant.client.get(`${w.base}/${path}`)
      expect(entrant.status).toBe(403)
      expect(entrant.body.message).toBe(MESSAGES.trackingStaffOnly)
      expect((await w.outsider.client.get(`${w.base}/${path}`)).status).toBe(404)
      expect((await w.anonymous.get(`${w.base}/${path}`)).status).toBe(401)
    }
    expect((await w.organiser.client.get('/api/competitions/not-an-id/tracking.json')).status).toBe(404)
  })
})
