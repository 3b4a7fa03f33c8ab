// The glider report through the built server and PostgreSQL, read as a person reads the printout
// (poppler-utils: pdfinfo, pdftotext, pdftoppm): an A4 PDF of one entry with its dossier, each
// finding with its rule and state (open, waived, fixed), every grid check's answers, each
// weigh-in's terms and the director's actions — never a document's content; a class's report
// with each accepted entry from a new page; who may fetch which.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'
import { pdfInfo, pdfPagePng, pdfPages } from '../../../support/pdf'
import { checkById, HARDWARE_CAUTION } from '../../../../shared/engine'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let r7: string // the entry reported on: findings open, waived and fixed; two grid checks; a hold and release
let s8: string // a second accepted entry of the class
let others: string // the other entrant's entry, in the Club class
let radioId: string
let slug: string

async function fetchPdf(path: string, cookie: string): Promise<{ res: Response, pdf: Buffer }> {
  const res = await fetch(`${baseUrl}${path}`, { headers: { cookie } })
  return { res, pdf: Buffer.from(await res.arrayBuffer()) }
}
const reportPath = (entryId: string) => `${w.base}/entries/${entryId}/report.pdf`
const weighIn = (main: number, tail: number) => ({ units: 'kg-m', readings: [{ point: 'main-wheel', weight: main, arm: 0.1 }, { point: 'tail-wheel', weight: tail, arm: 4 }] })

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Report Cup')
  slug = (await testDb()('competitions').where({ id: w.competitionId }).first('slug')).slug
  r7 = await gridEntry(w, { compId: 'R7' })
  s8 = await gridEntry(w, { compId: 'S8' })
  await gridEntry(w, { compId: 'W9', status: 'withdrawn' })
  others = await gridEntry(w, { compId: 'C1' })
  await testDb()('entries').where({ id: others }).update({ entrant_user_id: w.otherEntrant.user.id, class_id: w.otherClassId })
  await testDb()('memberships').insert({ user_id: w.otherEntrant.user.id, competition_id: w.competitionId, role: 'entrant' }).onConflict(['user_id', 'competition_id', 'role']).ignore()

  // R7: not paid (entry.paid, blocking); firmware expiring 13 days after the last contest day,
  // 2027-05-07 (firmware.expires-soon, advisory, within its 30 days); the pilot weighed at the desk.
  await testDb()('entries').where({ id: r7 }).update({ payment_status: 'unpaid', pilot_name: 'Ana Lindqvist' })
  await testDb()('units').where({ entry_id: r7, kind: 'collision-warning' }).update({ firmware_expires_on: '2027-05-20' })
  radioId = (await testDb()('units').where({ entry_id: r7, kind: 'collision-warning' }).first('radio_id')).radio_id
  expect((await w.scrutineer.client.request('PUT', `${w.base}/entries/${r7}/occupant-masses`, { pilotMassKg: 85 })).status).toBe(200)
  // A medical certificate, accepted: its state and validity are printed, never its name or content.
  await testDb()('documents').insert({
    entry_id: r7, competition_id: w.competitionId, kind: 'medical', original_filename: 'medical-secret-diagnosis.pdf', media_type: 'application/pdf',
    size_bytes: 1, sha256: '0'.repeat(64), storage_key: `test:medical:${r7}`, expires_on: '2028-03-31', status: 'accepted', uploaded_by: w.entrant.user.id,
  })

  await openToday(w)
  // Weighed too heavy (500 + 40 kg on the scales + 85 kg pilot = 625 kg > 525 kg), then again light
  // (280 + 20 + 85 = 385 kg): the mass findings come and go, so the report names them fixed.
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(r7, { weighIn: weighIn(500, 40), checkedAt: new Date(Date.now() - 60_000).toISOString() }))).status).toBe(201)
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(r7, { weighIn: weighIn(280, 20), notes: 'Reweighed with tanks empty' }))).status).toBe(201)
  expect((await w.director.client.post(`${w.base}/entries/${r7}/hold`, { reason: 'Canopy lock does not engage fully' })).status).toBe(201)
  expect((await w.director.client.post(`${w.base}/entries/${r7}/release`, { reason: 'Lock replaced and checked' })).status).toBe(201)
  expect((await w.director.client.post(`${w.base}/entries/${r7}/waivers`, { scope: 'day', checkId: 'entry.paid', reason: 'Paid in cash at the desk' })).status).toBe(201)
})

describe('one glider’s report', () => {
  let pdf: Buffer
  let pages: string[]
  let text: string

  beforeAll(async () => {
    const got = await fetchPdf(reportPath(r7), w.organiser.client.cookie)
    expect(got.res.status).toBe(200)
    expect(got.res.headers.get('content-type')).toBe('application/pdf')
    expect(got.res.headers.get('content-disposition')).toBe(`attachment; filename="report-${slug}-R7.pdf"`)
    pdf = got.pdf
    pages = pdfPages(pdf)
    text = pages.join(' ')
  })

  it('is an A4 PDF whose first page draws as a portrait A4 page, the glider named at its head', () => {
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    const info = pdfInfo(pdf)
    expect(info['Page size']).toMatch(/^595\.28 x 841\.89 pts \(A4\)/)
    expect(Number(info.Pages)).toBe(pages.length)
    const png = pdfPagePng(pdf, 'glider-report-R7-page-1')
    // One pixel a point at 72 dpi: 595.28 × 841.89 pt.
    expect(Math.abs(png.width - 595)).toBeLessThanOrEqual(1)
    expect(Math.abs(png.height - 842)).toBeLessThanOrEqual(1)
    expect(pages[0]).toMatch(/^GLIDER REPORT · REPORT CUP R7 Ana Lindqvist Kestrel Test 15 · G-[0-9A-F]{4} · Standard/)
    expect(pages[0]).toContain(`Page 1 of ${pages.length}`)
    expect(pages[0]).toContain('Gridmark assists the scrutineers; it does not replace their judgement.')
  })

  it('holds the dossier: pilot, co-pilot, glider, units with firmware, expiry and radio ID, recorders', () => {
    expect(text).toContain('PILOT IN COMMAND Ana Lindqvist')
    expect(text).toContain('CO-PILOT Cleo Copilot')
    expect(text).toContain('COMPETITION ID R7')
    expect(text).toContain(`Example CW-2 CW-0001 ${radioId} 7.20 2027-05-20 2027-01-10`)
    expect(text).toContain('Example Logger 3 FR-0001 — 2.1 All flights, including records')
  })

  it('gives a document’s kind, state and validity, never its file', () => {
    expect(text).toContain('Medical No Accepted 2028-03-31 Yes')
    expect(text).not.toMatch(/diagnosis|medical-secret/i)
  })

  it('lists each finding with its check id, rule and state: waived, open, and fixed since', () => {
    expect(text).toContain(`entry.paid ${checkById('entry.paid')!.rule} Blocking Waived`)
    expect(text).toContain('Waived for the day by Dana Director: Paid in cash at the desk')
    expect(text).toContain(`firmware.expires-soon ${checkById('firmware.expires-soon')!.rule} Advisory Open The firmware of the collision-warning unit Example CW-2 (radio ID ${radioId}) expires 2027-05-20`)
    expect(text).toMatch(/mass\.class-limit .+? Blocking Fixed .*?625\.0 kg/)
    expect(text).toMatch(/mass\.flight-manual .+? Blocking Fixed/)
    // The firmware fix touches hardware: the caution is printed (DESIGN.md, Safety and deference).
    expect(text).toContain(`Caution: ${HARDWARE_CAUTION}`.replace(/\s+/g, ' '))
  })

  it('gives every grid check of the competition with its answers and notes', () => {
    const answered = text.match(/Antennas fitted Pass Both fitted/g) ?? []
    expect(answered).toHaveLength(2)
    expect(text).toContain('Firmware version on the unit matches the dossier Pass')
    expect(text).toContain('Recorder declaration shows the right pilot, glider and competition ID Not checked')
    expect(text).toContain('Notes: Reweighed with tanks empty')
    expect(text).toMatch(/checked \d{4}-\d\d-\d\d \d\d:\d\d by Sam Scrutineer · (passed|failed)/)
  })

  it('gives each weigh-in with each term of its take-off mass and the sum', () => {
    // Take-off mass = scale readings + declared ballast + pilot with parachute (DESIGN.md; weigh-in.ts).
    expect(text).toContain('Scale readings 540 0.389')
    expect(text).toContain('Scale readings 300 0.36')
    expect(text.match(/Pilot with parachute 85 —/g)).toHaveLength(2)
    expect(text).toContain('Take-off mass (sum of the terms) 625')
    expect(text).toContain('Take-off mass (sum of the terms) 385')
    expect(text).toContain('Against: class limit 525 kg; flight manual MTOM 525 kg.')
  })

  it('lists the director’s actions: the hold, the release and the waiver, with reasons and who', () => {
    expect(text).toMatch(/Hold \d{4}-\d\d-\d\d Canopy lock does not engage fully Dana Director/)
    expect(text).toMatch(/Release \d{4}-\d\d-\d\d Lock replaced and checked Dana Director/)
    expect(text).toMatch(/Waiver \d{4}-\d\d-\d\d entry\.paid Paid in cash at the desk Dana Director/)
  })
})

describe('a class’s report', () => {
  it('gives each accepted entry of the class from a new page, and no other', async () => {
    const { res, pdf } = await fetchPdf(`${w.base}/classes/${w.classId}/report.pdf`, w.scrutineer.client.cookie)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="report-${slug}-Standard.pdf"`)
    const pages = pdfPages(pdf)
    expect(pages.length).toBeGreaterThanOrEqual(2)
    const starts = pages.flatMap((p, i) => (p.startsWith('GLIDER REPORT') ? [i] : []))
    expect(starts).toHaveLength(2)
    expect(starts[0]).toBe(0)
    expect(pages[starts[0]!]).toMatch(/^GLIDER REPORT · REPORT CUP R7 Ana Lindqvist/)
    expect(pages[starts[1]!]).toMatch(/^GLIDER REPORT · REPORT CUP S8 Erin Entrant/)
    // Each page belongs to one glider: R7's pages name no S8, and the other way round.
    pages.slice(0, starts[1]).forEach(p => expect(p).not.toContain('S8'))
    pages.slice(starts[1]).forEach(p => expect(p).not.toContain('R7'))
    // The withdrawn entry and the Club class's entry are not in it.
    expect(pages.join(' ')).not.toMatch(/\bW9\b|\bC1\b/)
    pdfPagePng(pdf, `class-report-page-${starts[1]! + 1}`, starts[1]! + 1)
  })

  it('says so on one page for a class without accepted entries', async () => {
    const { res, pdf } = await fetchPdf(`${w.base}/classes/${w.otherClassId}/report.pdf`, w.director.client.cookie)
    expect(res.status).toBe(200)
    const text = pdfPages(pdf).join(' ')
    expect(text).toContain('C1') // the other entrant's accepted Club entry
    await testDb()('entries').where({ id: others }).update({ status: 'withdrawn' })
    const empty = pdfPages((await fetchPdf(`${w.base}/classes/${w.otherClassId}/report.pdf`, w.director.client.cookie)).pdf)
    expect(empty).toHaveLength(1)
    expect(empty[0]).toContain('No accepted entry in this selection: nothing to report yet.')
    await testDb()('entries').where({ id: others }).update({ status: 'accepted' })
  })
})

describe('who may fetch a report', () => {
  it('lets the entrant fetch their own entry’s report, not another’s (404), nor a class’s (403 in words)', async () => {
    const own = await fetchPdf(reportPath(r7), w.entrant.client.cookie)
    expect(own.res.status).toBe(200)
    expect(pdfPages(own.pdf)[0]).toContain('R7')
    expect((await w.entrant.client.get(reportPath(others))).status).toBe(404)
    const klass = await w.entrant.client.get(`${w.base}/classes/${w.classId}/report.pdf`)
    expect(klass.status).toBe(403)
    expect(klass.body.message).toBe(MESSAGES.reportClassStaffOnly)
    expect((await w.otherEntrant.client.get(reportPath(others))).status).toBe(200)
  })

  it('lets every staff role; refuses an outsider (404) and anyone signed out (401)', async () => {
    for (const c of [w.scrutineer.client, w.director.client, w.admin.client]) {
      expect((await c.get(reportPath(s8))).status).toBe(200)
    }
    expect((await w.outsider.client.get(reportPath(r7))).status).toBe(404)
    expect((await w.anonymous.get(reportPath(r7))).status).toBe(401)
    expect((await w.outsider.client.get(`${w.base}/classes/${w.classId}/report.pdf`)).status).toBe(404)
    expect((await w.anonymous.get(`${w.base}/classes/${w.classId}/report.pdf`)).status).toBe(401)
  })

  it('answers 404 for an id that is none, an unknown entry or class', async () => {
    expect((await w.organiser.client.get(`${w.base}/entries/not-an-id/report.pdf`)).status).toBe(404)
    expect((await w.organiser.client.get(`${w.base}/classes/not-an-id/report.pdf`)).status).toBe(404)
    expect((await w.organiser.client.get(reportPath('00000000-0000-4000-8000-000000000000'))).status).toBe(404)
    const unknown = await w.organiser.client.get(`${w.base}/classes/00000000-0000-4000-8000-000000000000/report.pdf`)
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toBe(MESSAGES.classNotFound)
  })
})
