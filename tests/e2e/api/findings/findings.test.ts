/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The findings routes: the check engine over dossiers read from PostgreSQL, through the built
// server. One entry's findings for its entrant and the staff; the whole competition for staff;
// the seeded demo problems (read only); a finding that comes and goes with a save; the staff
// table's findings column, filter and CSV.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { parse } from 'csv-parse/sync'
import { ApiClient } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { collisionWarningUnit, createEntryVia, entriesWorld, entryBody, flightRecorderUnit, randomRadioId, type EntriesWorld } from '../../../support/entries'
import { rawRequest } from '../../../support/setup'
import { DEMO_COMPETITION, DEMO_PASSWORD } from '../../../../seeds/demo-data'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: EntriesWorld
let entryId: string
let cwUnitId: string
let findingsPath: string
beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Findings Cup')
  entryId = await createEntryVia(w.entrant.client, w.competitionId, entryBody(w.classId, { compId: 'FX' }))
  findingsPath = `/api/competitions/${w.competitionId}/entries/${entryId}/findings`
  const units = `/api/competitions/${w.competitionId}/entries/${entryId}/units`
  const cw = await w.entrant.client.post(units, collisionWarningUnit({ radioId: randomRadioId(), firmwareExpiresOn: '2028-05-01', firmwareUpdatedOn: '2027-01-10' }))
  expect(cw.status).toBe(201)
  cwUnitId = cw.body.id ?? cw.body.unit?.id
  expect((await w.entrant.client.post(units, flightRecorderUnit())).status).toBe(201)
})

const checkIds = (findings: any[]) => findings.map(f => f.checkId)

describe('GET /api/competitions/:id/entries/:entryId/findings', () => {
  it('answers the entrant and the staff; hides the entry from other entrants and non-members; asks strangers to sign in', async () => {
    const own = await w.entrant.client.get(findingsPath)
    expect(own.status).toBe(200)
    expect(own.body.entryId).toBe(entryId)
    expect(own.body.blocking + own.body.advisory).toBe(own.body.findings.length)
    expect((await w.scrutineer.client.get(findingsPath)).status).toBe(200)
    expect((await w.organiser.client.get(findingsPath)).status).toBe(200)

    await createEntryVia(w.otherEntrant.client, w.competitionId, entryBody(w.classId, { compId: 'OX', registration: 'G-OTHR' }))
    const other = await w.otherEntrant.client.get(findingsPath)
    expect(other.status).toBe(404)
    expect(other.body.message).toMatch(/entry/i)
    expect((await w.outsider.client.get(findingsPath)).status).toBe(404)
    expect((await w.anonymous.get(findingsPath)).status).toBe(401)
  })

  it('answers a malformed address as not found, in words', async () => {
    const res = await w.entrant.client.get(`/api/competitions/${w.competitionId}/entries/not-an-id/findings`)
    expect(res.status).toBe(404)
    expect(res.body.message.length).toBeGreaterThan(10)
  })

  it('lists blocking findings first, each with a reason and a fix hint', async () => {
    const { body } = await w.entrant.client.get(findingsPath)
    // No documents, no payment: documents.required and entry.paid block.
    expect(checkIds(body.findings)).toEqual(expect.arrayContaining(['documents.required', 'entry.paid']))
    const severities = body.findings.map((f: any) => f.severity)
    expect(severities).toEqual([...severities].sort((a: string, b: string) => (a === b ? 0 : a === 'blocking' ? -1 : 1)))
    for (const f of body.findings) {
      expect(f.reason.length).toBeGreaterThan(10)
      expect(f.fixHint.length).toBeGreaterThan(5)
    }
  })

  it('raises expired firmware with its caution after the save, and drops it once the firmware is fixed', async () => {
    const unitPath = `/api/competitions/${w.competitionId}/entries/${entryId}/units/${cwUnitId}`
    const radioId = (await testDb()('units').where({ id: cwUnitId }).first('radio_id')).radio_id
    // The test competition's last contest day is 2027-05-07; firmware expiring on it blocks.
    const saved = await w.entrant.client.request('PATCH', unitPath, collisionWarningUnit({ radioId, firmwareExpiresOn: '2027-05-07', firmwareUpdatedOn: '2027-01-10' }))
    expect(saved.status).toBe(200)
    const dossier = await w.entrant.client.get(`/api/competitions/${w.competitionId}/entries/${entryId}`)
    const expired = dossier.body.findings.find((f: any) => f.checkId === 'firmware.valid-through-contest')
    expect(expired).toMatchObject({ severity: 'blocking', unitId: cwUnitId })
    expect(expired.reason).toContain('expires 2027-05-07, the last contest day is 2027-05-07')
    expect(expired.caution).toContain('Power the unit off before inserting or removing update media')
    expect(checkIds((await w.entrant.client.get(findingsPath)).body.findings)).toContain('firmware.valid-through-contest')

    const fixed = await w.entrant.client.request('PATCH', unitPath, collisionWarningUnit({ radioId, firmwareExpiresOn: '2028-05-01', firmwareUpdatedOn: '2027-01-10' }))
    expect(fixed.status).toBe(200)
    const after = await w.entrant.client.get(`/api/competitions/${w.competitionId}/entries/${entryId}`)
    expect(checkIds(after.body.findings)).not.toContain('firmware.valid-through-contest')
    expect(checkIds(after.body.findings)).not.toContain('firmware.expires-soon')
  })

  it('counts the findings on My entries', async () => {
    const { body } = await w.entrant.client.get('/api/me/entries')
    const mine = body.entries.find((e: any) => e.id === entryId)
    const { body: f } = await w.entrant.client.get(findingsPath)
    expect(mine.findings).toEqual({ blocking: f.blocking, advisory: f.advisory, inReview: f.inReview })
    expect(mine.findings.blocking).toBeGreaterThan(0)
  })
})

describe('GET /api/competitions/:id/findings', () => {
  it('is for staff: organiser and scrutineer yes; entrants 403; non-members 404; strangers 401', async () => {
    const path = `/api/competitions/${w.competitionId}/findings`
    const res = await w.scrutineer.client.get(path)
    expect(res.status).toBe(200)
    expect((await w.organiser.client.get(path)).status).toBe(200)
    expect((await w.entrant.client.get(path)).status).toBe(403)
    expect((await w.outsider.client.get(path)).status).toBe(404)
    expect((await w.anonymous.get(path)).status).toBe(401)
    const mine = res.body.entries.find((e: any) => e.entryId === entryId)
    expect(mine).toMatchObject({ compId: 'FX', pilotName: 'Erin Entrant' })
    const total = res.body.entries.reduce((n: number, e: any) => n + e.findings.length, 0)
    expect(res.body.bySeverity.blocking + res.body.bySeverity.advisory).toBe(total)
    expect(res.body.byCheck['entry.paid'].blocking).toBe(res.body.entries.length)
  })
})

describe('the demo competition (read only)', () => {
  let demo: any
  beforeAll(async () => {
    const organiser = new ApiClient(baseUrl)
    const login = await organiser.post('/api/auth/login', { email: 'organiser@gridmark.example', password: DEMO_PASSWORD })
    expect(login.status).toBe(200)
    const competition = await testDb()('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    const res = await organiser.get(`/api/competitions/${competition.id}/findings`)
    expect(res.status).toBe(200)
    demo = res.body
  })
  const of = (compId: string) => demo.entries.find((e: any) => e.compId === compId).findings as any[]
  const has = (compId: string, checkId: string, severity: string) =>
    expect(of(compId).some(f => f.checkId === checkId && f.severity === severity), `${compId} ${severity} ${checkId}`).toBe(true)

  it('shows every seeded problem as its finding', () => {
    has('K7', 'firmware.valid-through-contest', 'blocking')
    has('T3', 'firmware.expires-soon', 'advisory')
    has('B2', 'radio-id.unique', 'blocking')
    has('M5', 'radio-id.unique', 'blocking')
    has('F9', 'entry.paid', 'blocking')
    has('R4', 'recorder.present', 'blocking')
    has('H8', 'firmware.yearly-update', 'advisory')
    has('G5', 'declaration.matches-entry', 'blocking')
    has('C4', 'documents.required', 'blocking')
    has('D6', 'span.class-limit', 'blocking')
    has('E2', 'motor-glider.engine-recording', 'blocking')
    has('S2', 'recorder.igc-file', 'blocking')
    has('N1', 'collision-warning.present', 'blocking')
    has('P6', 'mass.class-limit', 'blocking')
  })

  it('raises the new checks on their seeded glider only: L8, a motor glider recording engine noise, passes', () => {
    const raising = (checkId: string) => demo.entries.filter((e: any) => e.status === 'accepted' && e.findings.some((f: any) => f.checkId === checkId)).map((e: any) => e.compId).sort()
    expect(raising('span.class-limit')).toEqual(['D6'])
    expect(raising('motor-glider.engine-recording')).toEqual(['E2'])
    expect(raising('recorder.igc-file')).toEqual(['S2'])
    expect(raising('collision-warning.present')).toEqual(['N1'])
    expect(raising('mass.class-limit')).toEqual(['P6'])
    expect(raising('recorder.identity')).toEqual([])
    expect(of('P6').find(f => f.checkId === 'mass.class-limit').reason).toContain('543.0 kg (452.0 kg on the scales + pilot with parachute 91.0 kg)')
  })

  it('names the other glider in G5’s declaration, and the rejected insurance of C4', () => {
    const g5 = of('G5').filter(f => f.checkId === 'declaration.matches-entry' && f.severity === 'blocking')
    expect(g5.map(f => f.reason).join(' ')).toContain('“KM-ZZQ”')
    expect(of('C4').find(f => f.checkId === 'documents.required').reason).toContain('insurance document is valid until 2027-06-30')
  })

  it('does not raise a radio-ID clash for entries that hold their own radio ID', () => {
    const clashing = demo.entries.filter((e: any) => e.findings.some((f: any) => f.checkId === 'radio-id.unique')).map((e: any) => e.compId).sort()
    expect(clashing).toEqual(['B2', 'M5'])
  })
})

describe('the staff entries table: findings column, filter and CSV', () => {
  let clean: string
  beforeAll(async () => {
    // An entry with nothing open: paid, accepted documents, a current recorder file.
    clean = await createEntryVia(w.otherEntrant.client, w.competitionId, entryBody(w.classId, { compId: 'CL', registration: 'G-CLEN', pilotName: 'Otto Other', copilotName: undefined }))
    const units = `/api/competitions/${w.competitionId}/entries/${clean}/units`
    expect((await w.otherEntrant.client.post(units, collisionWarningUnit({ radioId: randomRadioId() }))).status).toBe(201)
    const recorder = await w.otherEntrant.client.post(units, flightRecorderUnit({ serial: 'FR-CLEAN' }))
    expect(recorder.status).toBe(201)
    // What the office and the scrutineers would have done: paid, papers accepted, a current IGC file.
    const by = w.otherEntrant.user.id
    await testDb()('entries').where({ id: clean }).update({ payment_status: 'paid' })
    await testDb()('documents').insert(['airworthiness', 'insurance', 'licence', 'medical'].map(kind => ({
      entry_id: clean, competition_id: w.competitionId, kind, original_filename: `${kind}.pdf`, media_type: 'application/pdf', size_bytes: 100,
      sha256: '0'.repeat(64), storage_key: `test/${clean}/${kind}`, expires_on: '2028-12-31', status: 'accepted', uploaded_by: by,
    })))
    await testDb()('igc_files').insert({
      entry_id: clean, competition_id: w.competitionId, unit_id: recorder.body.id, original_filename: 'clean.igc', storage_key: `test/${clean}/igc`,
      sha256: '0'.repeat(64), size_bytes: 100, flight_date: '2027-03-01', pilot: 'Other Otto', glider_type: 'Kestrel Test 15',
      glider_id: 'G-CLEN', declared_comp_id: 'cl', declared_class: 'Standard', has_g_record: true, uploaded_by: by,
    })
  })

  it('finds nothing on an entry with nothing open', async () => {
    const res = await w.otherEntrant.client.get(`/api/competitions/${w.competitionId}/entries/${clean}/findings`)
    expect(res.status).toBe(200)
    expect(res.body.findings).toEqual([])
    expect(res.body).toMatchObject({ blocking: 0, advisory: 0 })
  })

  const table = (query: string) => w.scrutineer.client.get(`/api/competitions/${w.competitionId}/entries?${query}`)

  it('counts each row’s findings by severity', async () => {
    const res = await table('pageSize=100')
    expect(res.status).toBe(200)
    const fx = res.body.rows.find((r: any) => r.compId === 'FX')
    const { body: f } = await w.entrant.client.get(findingsPath)
    expect(fx.findings).toEqual({ blocking: f.blocking, advisory: f.advisory, inReview: f.inReview })
  })

  it('filters by has blocking, has advisory and none, server side', async () => {
    const all = (await table('pageSize=100')).body.rows as any[]
    const blocking = (await table('findings=blocking&pageSize=100')).body
    expect(blocking.rows.map((r: any) => r.compId).sort()).toEqual(all.filter(r => r.findings.blocking > 0).map(r => r.compId).sort())
    expect(blocking.total).toBe(blocking.rows.length)
    const advisory = (await table('findings=advisory&pageSize=100')).body.rows as any[]
    expect(advisory.every(r => r.findings.advisory > 0)).toBe(true)
    const none = (await table('findings=none&pageSize=100')).body.rows as any[]
    expect(none.map(r => r.compId)).toEqual(all.filter(r => r.findings.blocking + r.findings.advisory === 0).map(r => r.compId))
    expect(none.map(r => r.compId)).toContain('CL')
    expect(blocking.rows.map((r: any) => r.compId)).not.toContain('CL')
    expect((await table('findings=any&pageSize=100')).body.total).toBe(all.length)
  })

  it('refuses an unknown findings filter with a sentence', async () => {
    const res = await table('findings=lots')
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.findings[0]).toBe('Filter findings by any, blocking, advisory or none.')
  })

  it('exports the findings in the CSV, under the same filter', async () => {
    const res = await rawRequest(w.organiser.client, 'GET', `/api/competitions/${w.competitionId}/entries/export?findings=blocking`)
    expect(res.status).toBe(200)
    const [header, ...rows] = parse(res.text) as string[][]
    expect(header!.slice(-3)).toEqual(['Blocking findings', 'Advisory findings', 'Findings'])
    const fx = rows.find(r => r[0] === 'FX')!
    expect(Number(fx[12])).toBeGreaterThan(0)
    expect(fx[14]).toContain('blocking: entry.paid')
    expect(rows.every(r => Number(r[12]) > 0)).toBe(true)
  })
})
