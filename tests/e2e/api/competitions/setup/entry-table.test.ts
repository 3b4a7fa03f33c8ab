// The staff entries table and its CSV export, proved on 1,000 generated entries: every sort,
// filter, search and page is compared with what the generated data says it must be.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { parse } from 'csv-parse/sync'
import { closeTestDb, createClass, createEntry, testDb } from '../../../../support/db'
import { competitionWithRoles, insertGeneratedEntries, rawRequest, type GeneratedEntry, type RoleClients } from '../../../../support/setup'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let t: RoleClients
let path: string
let entries: GeneratedEntry[]
let classIds: string[]
beforeAll(async () => {
  t = await competitionWithRoles(baseUrl, 'Setup Table Cup')
  path = `/api/competitions/${t.competitionId}/entries`
  // Sort order puts "Standard" (0) before "Club" (1) before "18 Metre" (2), unlike their names.
  classIds = [await createClass(t.competitionId, 'Standard'), await createClass(t.competitionId, 'Club'), await createClass(t.competitionId, '18 Metre')]
  await testDb()('classes').where({ id: classIds[1] }).update({ sort_order: 1 })
  await testDb()('classes').where({ id: classIds[2] }).update({ sort_order: 2 })
  entries = await insertGeneratedEntries(t.competitionId, classIds, t.ids.entrant, 1000)
})

/** Every row of a query, page by page, so paging itself is part of what is checked. */
async function allPages(query: string, pageSize = 100) {
  const rows: { compId: string, pilotName: string, className: string, status: string, paymentStatus: string, submittedAt: string | null }[] = []
  for (let page = 1; ; page++) {
    const res = await t.scrutineer.get(`${path}?${query}&page=${page}&pageSize=${pageSize}`)
    expect(res.status).toBe(200)
    rows.push(...res.body.rows)
    if (rows.length >= res.body.total || res.body.rows.length === 0) return { rows, total: res.body.total as number }
  }
}

// Competition IDs sort shorter first: "2" before "10" before "RS".
const compKey = (e: GeneratedEntry) => e.comp_id.padStart(3, ' ')
const byCompId = (a: GeneratedEntry, b: GeneratedEntry) => (compKey(a) < compKey(b) ? -1 : compKey(a) > compKey(b) ? 1 : 0)

describe('GET /api/competitions/:id/entries', () => {
  it('answers the first page sorted by competition ID, with the total', async () => {
    const res = await t.director.get(`${path}?pageSize=10`)
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(1000)
    expect(res.body.rows).toHaveLength(10)
    expect(res.body.rows.map((r: { compId: string }) => r.compId)).toEqual([...entries].sort(byCompId).slice(0, 10).map(e => e.comp_id))
    expect(res.body.rows[0]).toMatchObject({ compId: '0', pilotName: 'Ana Moorcroft 0', className: 'Standard', status: 'draft', paymentStatus: 'unpaid', submittedAt: null })
    expect(res.body.currency).toBe('EUR')
  })

  it('pages through all 1,000 entries once each, without overlap', async () => {
    const { rows, total } = await allPages('sort=pilot', 100)
    expect(total).toBe(1000)
    expect(new Set(rows.map(r => r.compId)).size).toBe(1000)
    // The test cluster uses the C.UTF-8 collation: byte order, as JavaScript's < compares ASCII.
    const key = (e: GeneratedEntry) => e.pilot_name.toLowerCase()
    const expected = [...entries].sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : byCompId(a, b)))
    expect(rows.map(r => r.pilotName)).toEqual(expected.map(e => e.pilot_name))
  })

  it('sorts by class in the competition’s class order, both ways', async () => {
    const asc = await t.scrutineer.get(`${path}?sort=class&pageSize=1`)
    expect(asc.body.rows[0].className).toBe('Standard')
    const desc = await t.scrutineer.get(`${path}?sort=class&direction=desc&pageSize=1`)
    expect(desc.body.rows[0].className).toBe('18 Metre')
  })

  it('sorts by submission date with unsubmitted entries last, both ways', async () => {
    const asc = await t.scrutineer.get(`${path}?sort=submitted&pageSize=1`)
    const firstSubmitted = entries.filter(e => e.submitted_at).sort((a, b) => a.submitted_at!.getTime() - b.submitted_at!.getTime())[0]!
    expect(asc.body.rows[0].compId).toBe(firstSubmitted.comp_id)
    const desc = await allPages('sort=submitted&direction=desc', 100)
    expect(desc.rows[0]!.submittedAt).toBe(new Date(Date.UTC(2027, 2, 1) + 999 * 3_600_000).toISOString())
    expect(desc.rows.at(-1)!.submittedAt).toBeNull()
    expect(desc.rows.findIndex(r => r.submittedAt === null)).toBe(800) // 200 drafts, all at the end
  })

  it('sorts by status and by payment', async () => {
    const status = await allPages('sort=status', 100)
    const statuses = status.rows.map(r => r.status)
    expect(statuses).toEqual([...statuses].sort())
    const payment = await t.scrutineer.get(`${path}?sort=payment&direction=desc&pageSize=1`)
    expect(payment.body.rows[0].paymentStatus).toBe('unpaid')
  })

  it('filters by class, status and payment together, and counts the matches', async () => {
    const res = await allPages(`class=${classIds[1]}&status=accepted&payment=paid`)
    const expected = entries.filter(e => e.class_id === classIds[1] && e.status === 'accepted' && e.payment_status === 'paid')
    expect(expected.length).toBeGreaterThan(0)
    expect(res.total).toBe(expected.length)
    expect(res.rows.map(r => r.compId).sort()).toEqual(expected.map(e => e.comp_id).sort())
    expect(res.rows.every(r => r.className === 'Club' && r.status === 'accepted' && r.paymentStatus === 'paid')).toBe(true)
  })

  it('searches pilot name, registration and competition ID, ignoring case', async () => {
    const byName = await allPages('q=glideMAN')
    expect(byName.total).toBe(entries.filter(e => e.pilot_name.toLowerCase().includes('glideman')).length)
    const byReg = await t.scrutineer.get(`${path}?q=d-1999`)
    expect(byReg.body.rows.map((r: { compId: string }) => r.compId)).toEqual([(999).toString(36).toUpperCase()])
    const rr = await allPages('q=rR')
    const matches = (e: GeneratedEntry) => [e.pilot_name, e.registration, e.comp_id].some(v => v.toLowerCase().includes('rr'))
    expect(rr.rows.map(r => r.compId).sort()).toEqual(entries.filter(matches).map(e => e.comp_id).sort())
    expect(rr.rows.map(r => r.compId)).toContain('RR')
    const combined = await allPages('q=Vario&status=withdrawn')
    expect(combined.total).toBe(entries.filter(e => e.pilot_name.includes('Vario') && e.status === 'withdrawn').length)
  })

  it('treats % and _ in a search as plain text', async () => {
    const res = await t.scrutineer.get(`${path}?q=${encodeURIComponent('%')}`)
    expect(res.body.total).toBe(0)
  })

  it('answers an empty page past the end', async () => {
    const res = await t.scrutineer.get(`${path}?page=11&pageSize=100`)
    expect(res.body).toMatchObject({ rows: [], total: 1000, page: 11 })
  })

  it('answers 400 with field errors for a bad query', async () => {
    const res = await t.scrutineer.get(`${path}?sort=colour&pageSize=500&status=lost&class=abc&page=0`)
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fieldErrors).sort()).toEqual(['class', 'page', 'pageSize', 'sort', 'status'])
    expect(res.body.data.fieldErrors.pageSize[0]).toBe('Show at most 100 entries a page.')
  })

  it('shows organisers, scrutineers, directors and site admins; refuses entrants (403), outsiders (404), strangers (401)', async () => {
    for (const c of [t.organiser, t.scrutineer, t.director, t.admin]) expect((await c.get(`${path}?pageSize=1`)).status).toBe(200)
    expect((await t.entrant.get(path)).status).toBe(403)
    expect((await t.outsider.get(path)).status).toBe(404)
    expect((await t.anonymous.get(path)).status).toBe(401)
  })
})

describe('GET /api/competitions/:id/entries/export', () => {
  it('downloads every matching entry as CSV, in the table’s order', async () => {
    const res = await rawRequest(t.organiser, 'GET', `${path}/export?class=${classIds[2]}&sort=compId`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="setup-table-cup-[a-z0-9]+-entries\.csv"$/)
    const records = parse(res.text) as string[][]
    expect(records[0]).toEqual(['Competition ID', 'Pilot', 'Co-pilot', 'Nationality', 'Class', 'Glider type', 'Registration', 'Status', 'Payment', 'Paid', 'Currency', 'Submitted at', 'Blocking findings', 'Advisory findings', 'Findings'])
    const expected = entries.filter(e => e.class_id === classIds[2]).sort(byCompId)
    expect(records.slice(1).map(r => r[0])).toEqual(expected.map(e => e.comp_id))
    expect(records[1]!.slice(0, 12)).toEqual([expected[0]!.comp_id, expected[0]!.pilot_name, '', '', '18 Metre', 'Test Glider 15', expected[0]!.registration, expected[0]!.status, expected[0]!.payment_status, '0.00', 'EUR', expected[0]!.submitted_at?.toISOString() ?? ''])
    // An entry with no units, documents or payment: blocking findings, named in the last column.
    expect(Number(records[1]![12])).toBeGreaterThan(0)
    expect(records[1]![14]).toContain('blocking: recorder.present')
  })

  it('defuses cells a spreadsheet would run as formulas', async () => {
    const other = await competitionWithRoles(baseUrl, 'Setup Export Cup')
    const classId = await createClass(other.competitionId, 'Club')
    const id = await createEntry({ competitionId: other.competitionId, classId, entrantUserId: other.ids.entrant, compId: 'X1' })
    await testDb()('entries').where({ id }).update({ pilot_name: '=HYPERLINK("http://bad.example")', registration: '+49-1', glider_type: '@SUM(A1)', copilot_name: '-2+3' })
    const res = await rawRequest(other.organiser, 'GET', `/api/competitions/${other.competitionId}/entries/export`)
    const [, row] = parse(res.text) as string[][]
    expect(row![1]).toBe('\'=HYPERLINK("http://bad.example")')
    expect(row![2]).toBe('\'-2+3')
    expect(row![5]).toBe('\'@SUM(A1)')
    expect(row![6]).toBe('\'+49-1')
  })

  it('is for organisers: scrutineers, directors, entrants 403; outsiders 404; strangers 401; bad filters 400', async () => {
    for (const c of [t.scrutineer, t.director, t.entrant]) expect((await c.get(`${path}/export`)).status).toBe(403)
    expect((await t.outsider.get(`${path}/export`)).status).toBe(404)
    expect((await t.anonymous.get(`${path}/export`)).status).toBe(401)
    expect((await t.organiser.get(`${path}/export?payment=maybe`)).status).toBe(400)
  })
})
