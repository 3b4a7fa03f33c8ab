// The glider report's pure parts: each finding's state (open, waiting for review, waived, fixed)
// from the checks now, the findings that came and went and the director's waivers; the
// documents with the required kinds that are missing; each weigh-in's terms; and the PDF itself
// (A4, one entry per page at least).
import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION, type Dossier } from '#shared/engine'
import type { BoardFinding, DirectorActionRecord } from '#shared/types/api-board'
import { DEFAULT_RULES } from '#shared/schemas/competition'
import type { FindingChangeRecord } from '#domain/audit/audit-log'
import { buildEntryReport, reportDocuments, reportFilename, reportFindings, reportWeighIns, type GliderReport } from '#domain/reports/entry-report'
import { localTime, renderGliderReport } from '#domain/reports/entry-report-pdf'

const finding = (over: Partial<BoardFinding> = {}): BoardFinding => ({
  checkId: 'entry.paid', severity: 'blocking', reason: 'The entry fee is not paid.', fixHint: 'Pay the fee.', waiver: null, ...over,
})
const change = (over: Partial<FindingChangeRecord> = {}): FindingChangeRecord => ({
  entryId: 'e1', at: '2027-05-01T08:00:00.000Z', day: '2027-05-01', cause: 'grid-check', added: [], removed: [], ...over,
})
const waiver = (over: Partial<DirectorActionRecord> = {}): DirectorActionRecord => ({
  id: 'a1', kind: 'waiver', day: '2027-05-01', scope: 'day', checkId: 'firmware.expires-soon', unitId: 'u1', subject: null,
  reason: 'Update booked', finding: { severity: 'advisory', reason: 'Firmware expires soon.' }, actor: { id: 'd', name: 'Dana Director' },
  at: '2027-05-01T09:00:00.000Z', withdrawal: null, ...over,
})

const competition = {
  firstContestDay: '2027-05-01', lastContestDay: '2027-05-07', timeZone: 'Europe/Berlin',
  rules: { ...DEFAULT_RULES, requiredDocumentKinds: ['airworthiness', 'insurance', 'medical'] },
  classLimits: { standard: { maxMtomKg: 525 } },
} as never

const dossier = (over: Partial<Dossier> = {}): Dossier => ({
  entry: {
    id: 'e1', compId: 'K7', registration: 'D-1234', gliderType: 'Kestrel 15', pilotName: 'Ana Lind', copilotName: null, className: 'Standard',
    classCode: 'standard', status: 'accepted', mtomKg: 525, pilotMassKg: 88, pilotArmM: -0.5, ballastArmM: 0.1,
  },
  units: [
    { id: 'u1', kind: 'collision-warning', model: 'Example CW-2', serial: 'CW1', radioId: '3D2F1A', firmwareVersion: '7.20', firmwareExpiresOn: '2027-10-31' },
    { id: 'u2', kind: 'flight-recorder', model: 'Example Logger 3', serial: 'FR1', firmwareVersion: '2.1', approvalLevel: 'all-flights' },
  ],
  documents: [
    { kind: 'medical', status: 'accepted', expiresOn: '2028-01-31' },
    { kind: 'airworthiness', status: 'pending', expiresOn: '2027-05-03' },
  ],
  igcFiles: [],
  payment: { status: 'paid' },
  weighIns: [{ id: 'w1', weighedOn: '2027-05-01', units: 'kg-m', readings: [{ point: 'main-wheel', weight: 300, arm: 0.1 }, { point: 'tail-wheel', weight: 20, arm: 4 }], declaredBallastKg: 40 }],
  ...over,
})

describe('the state of each finding', () => {
  it('names what the checks give now open, waiting for review, or waived with its waiver', () => {
    const out = reportFindings([
      finding(),
      finding({ checkId: 'documents.required', subject: 'insurance', awaiting: 'review', reason: 'Insurance waits for review.' }),
      finding({ checkId: 'firmware.expires-soon', severity: 'advisory', unitId: 'u1', caution: HARDWARE_CAUTION, waiver: { id: 'a1', scope: 'competition', reason: 'Update booked', by: 'Dana Director', at: '2027-05-01T09:00:00.000Z' } }),
    ], [], [])
    expect(out.map(f => [f.checkId, f.state])).toEqual([
      ['entry.paid', 'open'],
      ['documents.required', 'waiting for review'],
      ['firmware.expires-soon', 'waived'],
    ])
    // The rule as the rulebook states it (the catalogue's `rule`), and the waiver in words.
    expect(out[0]!.title).toMatch(/fee/i)
    expect(out[2]!.detail).toBe('Waived for the whole competition by Dana Director: Update booked')
    expect(out[2]!.caution).toBe(HARDWARE_CAUTION)
  })

  it('names a finding removed since, and not found now, fixed — with the day and how', () => {
    const out = reportFindings([finding()], [
      change({ added: [{ checkId: 'mass.class-limit', severity: 'blocking', reason: 'Weighed 540 kg.' }] }),
      change({ day: '2027-05-02', cause: 'grid-check', removed: [{ checkId: 'mass.class-limit', severity: 'blocking', reason: 'Weighed 540 kg.' }] }),
    ], [])
    expect(out.map(f => [f.checkId, f.state])).toEqual([['entry.paid', 'open'], ['mass.class-limit', 'fixed']])
    expect(out[1]).toMatchObject({ reason: 'Weighed 540 kg.', detail: 'No longer found from 2027-05-02, at a grid check.' })
  })

  it('keeps a finding that was removed and came back as it stands now, not fixed', () => {
    const out = reportFindings([finding()], [
      change({ removed: [{ checkId: 'entry.paid', severity: 'blocking', reason: 'old' }] }),
      change({ added: [{ checkId: 'entry.paid', severity: 'blocking', reason: 'The entry fee is not paid.' }] }),
    ], [])
    expect(out.map(f => f.state)).toEqual(['open'])
  })

  it('does not call a change of severity a fix', () => {
    const out = reportFindings([], [change({
      removed: [{ checkId: 'declaration.matches-entry', severity: 'advisory', reason: 'a' }],
      added: [{ checkId: 'declaration.matches-entry', severity: 'blocking', reason: 'b' }],
    })], [])
    expect(out).toEqual([])
  })

  it('names a finding waived earlier that the checks no longer give fixed; one that still stands is not listed twice', () => {
    const gone = reportFindings([], [], [waiver()])
    expect(gone).toEqual([expect.objectContaining({ checkId: 'firmware.expires-soon', severity: 'advisory', state: 'fixed', reason: 'Firmware expires soon.' })])
    const standing = reportFindings([finding({ checkId: 'firmware.expires-soon', unitId: 'u1', severity: 'advisory' })], [], [waiver({ day: '2027-04-30' })])
    expect(standing.map(f => f.state)).toEqual(['open'])
  })
})

describe('documents and weigh-ins', () => {
  it('lists each current document with its state and validity, and a required kind not uploaded', () => {
    const docs = reportDocuments(dossier(), competition)
    expect(docs).toEqual([
      { kind: 'airworthiness', label: 'Airworthiness review', state: 'Awaiting review', validUntil: '2027-05-03', validThroughContest: false, required: true },
      { kind: 'insurance', label: 'Insurance', state: 'Not uploaded', validUntil: null, validThroughContest: null, required: true },
      { kind: 'medical', label: 'Medical', state: 'Accepted', validUntil: '2028-01-31', validThroughContest: true, required: true },
    ])
  })

  it('gives each term of the take-off mass: scale readings, declared ballast, the pilot (shared/engine/weigh-in.ts)', () => {
    const [w] = reportWeighIns(dossier())
    expect(w!.terms.map(t => [t.term, t.massKg])).toEqual([['glider', 320], ['ballast', 40], ['pilot', 88]])
    // 320 + 40 + 88 = 448 kg; CG = (300·0.1 + 20·4 + 40·0.1 + 88·(−0.5)) / 448 (mass × arm; FAA-H-8083-1).
    expect(w!.massKg).toBe(448)
    expect(w!.cgArmM).toBeCloseTo((30 + 80 + 4 - 44) / 448, 6)
  })
})

describe('the PDF', () => {
  const report = (n: number): GliderReport => ({
    competition: { name: 'Kestrel Moor Regionals', timeZone: 'Europe/Berlin', firstContestDay: '2027-05-01', lastContestDay: '2027-05-07' },
    day: { day: '2027-05-01', kind: 'contest', status: 'open' },
    title: 'Glider reports — Standard',
    generatedAt: '2027-05-01T10:00:00.000Z',
    entries: Array.from({ length: n }, (_, i) => buildEntryReport({
      dossier: dossier({ entry: { ...dossier().entry, id: `e${i}`, compId: `K${i}` } }),
      row: { id: `e${i}`, status: 'accepted', payment_status: 'paid' } as never,
      competition,
      findings: [finding()],
      changes: [],
      actions: [waiver()],
      gridChecks: [],
    })),
  })
  const pages = (pdf: Buffer) => pdf.toString('latin1').match(/\/Type \/Page\b/g)?.length ?? 0

  it('is an A4 document with a page per entry at least', async () => {
    const one = await renderGliderReport(report(1))
    expect(one.subarray(0, 5).toString()).toBe('%PDF-')
    expect(one.toString('latin1')).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/)
    const three = await renderGliderReport(report(3))
    expect(pages(three)).toBeGreaterThanOrEqual(3)
    expect(pages(three)).toBeGreaterThan(pages(one))
  })

  it('says so on one page when there is no entry', async () => {
    expect(pages(await renderGliderReport(report(0)))).toBe(1)
  })

  it('prints times in the competition’s time zone and names files safely', () => {
    expect(localTime('2027-05-01T10:05:00.000Z', 'Europe/Berlin')).toBe('2027-05-01 12:05')
    expect(reportFilename('kestrel-moor', '18 Metre / Club')).toBe('report-kestrel-moor-18-Metre-Club.pdf')
  })
})
