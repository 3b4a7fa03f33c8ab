// Rows as the database gives them → the check engine's dossiers and competition, then the
// engine over them: the mapping keeps every value the checks read.
import { describe, expect, it } from 'vitest'
import { DEFAULT_RULES } from '#shared/schemas/competition'
import { buildField, evaluate } from '#shared/engine'
import {
  classKey, toDossiers, toEngineCompetition, toEngineIgcFile, toEngineUnit, toField, toWeighInRecord,
  type FindingsEntryRow, type FindingsFieldEntry, type FindingsFieldRadioId, type FindingsIgcRow, type FindingsUnitRow, type FindingsWeighInRow,
} from '#domain/read-model/dossiers'
import { countFindings } from '#domain/findings/findings'

const entry = (over: Partial<FindingsEntryRow> = {}): FindingsEntryRow => ({
  id: 'e1', comp_id: 'K7', registration: 'D-1234', glider_type: 'Kestrel 15', pilot_name: 'Ana Lind', copilot_name: null,
  status: 'submitted', payment_status: 'paid', mtom_kg: '525.0', cg_forward_limit_m: null, cg_aft_limit_m: '0.400',
  class_id: 'c1', class_name: 'Standard', class_code: 'standard', ...over,
})
const warner = (over: Partial<FindingsUnitRow> = {}): FindingsUnitRow => ({
  id: 'u1', entry_id: 'e1', kind: 'collision-warning', model: 'Example CW-2', serial: 'CW1', radio_id: 'ABC123', firmware_version: '7.20',
  firmware_expires_on: '2027-10-31', firmware_updated_on: '2027-01-10', obstacle_db_expires_on: null, approval_level: null, ...over,
})
const recorder: FindingsUnitRow = {
  id: 'u2', entry_id: 'e1', kind: 'flight-recorder', model: 'Logger', serial: 'FR1', radio_id: null, firmware_version: '2.1',
  firmware_expires_on: null, firmware_updated_on: null, obstacle_db_expires_on: null, approval_level: 'all-flights',
}
const igc = (over: Partial<FindingsIgcRow> = {}): FindingsIgcRow => ({
  id: 'f1', entry_id: 'e1', unit_id: 'u2', flight_date: '2027-05-01', pilot: 'Lind Ana', copilot: null, glider_type: 'Kestrel 15',
  glider_id: 'd1234', declared_comp_id: 'k7', declared_class: 'Standard', has_g_record: true, uploaded_at: new Date('2027-05-02T10:00:00Z'), ...over,
})
const competition = toEngineCompetition(
  { time_zone: 'Europe/Berlin', first_contest_day: '2027-07-10', last_contest_day: '2027-07-18', settings: { firmwareMarginDays: 2 } },
  [{ id: 'c1', code: 'standard', max_mtom_kg: '525.0' }, { id: 'c9', code: 'custom', max_mtom_kg: null }],
  [{ unit_family: 'Example CW', version: '7.20', expires_on: '2027-10-31' }],
)!

describe('row → engine mappings', () => {
  it('turns numeric text into numbers, and keys custom classes by their id', () => {
    const [d] = toDossiers([entry()], [], [], [])
    expect(d!.entry).toMatchObject({ compId: 'K7', classCode: 'standard', mtomKg: 525, cgForwardLimitM: null, cgAftLimitM: 0.4, status: 'submitted' })
    expect(d!.payment).toEqual({ status: 'paid' })
    expect(d!.weighIns).toEqual([])
    expect(classKey('custom', 'c9')).toBe('custom:c9')
    expect(competition.classLimits).toEqual({ 'standard': { maxMtomKg: 525, maxSpanM: null, waterBallast: true }, 'custom:c9': { maxMtomKg: null, maxSpanM: null, waterBallast: true } })
  })

  it('merges the stored rules over the defaults and keeps the firmware catalogue', () => {
    expect(competition.rules).toEqual({ ...DEFAULT_RULES, firmwareMarginDays: 2 })
    expect(competition.firmwareCatalogue).toEqual([{ family: 'Example CW', version: '7.20', expiresOn: '2027-10-31' }])
    expect(toEngineCompetition({ time_zone: 'UTC', first_contest_day: null, last_contest_day: null, settings: {} }, [], [])).toBeNull()
  })

  it('maps each kind of unit to its engine shape', () => {
    expect(toEngineUnit(warner())).toEqual({
      id: 'u1', kind: 'collision-warning', model: 'Example CW-2', serial: 'CW1', radioId: 'ABC123', firmwareVersion: '7.20',
      firmwareExpiresOn: '2027-10-31', firmwareUpdatedOn: '2027-01-10', obstacleDbExpiresOn: null,
    })
    expect(toEngineUnit(recorder)).toEqual({ id: 'u2', kind: 'flight-recorder', model: 'Logger', serial: 'FR1', firmwareVersion: '2.1', approvalLevel: 'all-flights', igcRecorderId: null })
  })

  it('reads the IGC header fields, and keeps a file tied to no recorder (unitId null: recorder.igc-file asks which)', () => {
    expect(toEngineIgcFile(igc())).toMatchObject({ unitId: 'u2', gliderId: 'd1234', competitionId: 'k7', competitionClass: 'Standard', hasGRecord: true, uploadedAt: '2027-05-02T10:00:00.000Z', extensions: [] })
    expect(toEngineIgcFile(igc({ unit_id: null, recorder_id: 'XKMABC', extensions: ['FXA', 'ENL'] }))).toMatchObject({ unitId: null, recorderId: 'XKMABC', extensions: ['FXA', 'ENL'] })
  })

  it('groups units, documents and files under their entries', () => {
    const dossiers = toDossiers(
      [entry(), entry({ id: 'e2', comp_id: 'T3' })],
      [warner(), recorder, warner({ id: 'u3', entry_id: 'e2', radio_id: 'DEF456' })],
      [{ id: 'd1', entry_id: 'e2', kind: 'insurance', status: 'rejected', expires_on: '2028-01-01' }],
      [igc()],
    )
    expect(dossiers.map(d => [d.entry.id, d.units.length, d.documents.length, d.igcFiles.length])).toEqual([['e1', 2, 0, 1], ['e2', 1, 1, 0]])
  })

  it('gives each entry its weigh-ins in the order read, readings as numbers, and the day’s grid check', () => {
    const weighed = (over: Partial<FindingsWeighInRow>): FindingsWeighInRow => ({
      id: 'w1', entry_id: 'e1', weighed_on: '2027-07-11', units: 'kg-m', readings: [{ point: 'main-wheel', weight: 500, arm: 0.1 }], ...over,
    })
    // jsonb keeps numbers, but a reading typed by hand elsewhere may arrive as text.
    const fromText = weighed({ id: 'w2', weighed_on: '2027-07-12', readings: [{ point: 'tail-skid', weight: '30.5' as unknown as number, arm: '4.2' as unknown as number }] })
    const dossiers = toDossiers(
      [entry(), entry({ id: 'e2', comp_id: 'T3' })], [], [], [],
      [weighed({}), fromText, weighed({ id: 'w3', entry_id: 'e2' })],
      [{ entry_id: 'e2', day: '2027-07-12', outcome: 'fail' }],
    )
    expect(dossiers[0]!.weighIns.map(w => w.id)).toEqual(['w1', 'w2'])
    expect(dossiers[0]!.weighIns[1]).toEqual({ id: 'w2', weighedOn: '2027-07-12', units: 'kg-m', readings: [{ point: 'tail-skid', weight: 30.5, arm: 4.2 }], declaredBallastKg: 0 })
    expect(dossiers[0]!.gridCheck).toBeUndefined()
    expect(dossiers[1]!.weighIns.map(w => w.id)).toEqual(['w3'])
    expect(dossiers[1]!.gridCheck).toEqual({ day: '2027-07-12', outcome: 'fail', answers: [] })
    expect(toWeighInRecord(weighed({})).readings).toEqual([{ point: 'main-wheel', weight: 500, arm: 0.1 }])
  })
})

describe('the engine over mapped rows', () => {
  it('blocks firmware that expires within the margin, with the hardware caution, and passes once it is fixed', () => {
    const rows = (expires: string) => toDossiers([entry()], [warner({ firmware_expires_on: expires }), recorder], [], [igc()])
    const before = rows('2027-07-19') // the day after the last contest day, inside the 2-day margin
    const found = evaluate(before[0]!, competition, buildField(before)).filter(f => f.checkId === 'firmware.valid-through-contest')
    expect(found).toHaveLength(1)
    expect(found[0]!.severity).toBe('blocking')
    expect(found[0]!.reason).toContain('expires 2027-07-19, the last contest day is 2027-07-18')
    expect(found[0]!.caution).toContain('Power the unit off')
    const after = rows('2027-10-31')
    expect(evaluate(after[0]!, competition, buildField(after)).map(f => f.checkId)).not.toContain('firmware.valid-through-contest')
  })

  it('raises mass.class-limit from the weigh-in of the evaluated day or before, not a later one', () => {
    // Standard class 525 kg (FAI Sporting Code Section 3 Annex A, from memory): with the pilot's
    // 80 kg, 540 kg on the scales is over (620 kg), 400 kg is not (480 kg).
    const heavy: FindingsWeighInRow = { id: 'w9', entry_id: 'e1', weighed_on: '2027-07-12', units: 'kg-m', readings: [{ point: 'main-wheel', weight: 505, arm: 0.1 }, { point: 'tail-wheel', weight: 35, arm: 4.4 }] }
    const light: FindingsWeighInRow = { ...heavy, id: 'w8', weighed_on: '2027-07-11', readings: [{ point: 'main-wheel', weight: 400, arm: 0.1 }] }
    const ds = toDossiers([entry({ pilot_mass_kg: '80.0' })], [warner(), recorder], [], [igc()], [light, heavy])
    const ids = (day?: string) => evaluate(ds[0]!, competition, buildField(ds), day).map(f => f.checkId)
    expect(ids('2027-07-11')).not.toContain('mass.class-limit')
    expect(ids('2027-07-12')).toContain('mass.class-limit')
    expect(ids()).toContain('mass.class-limit')
  })

  it('counts findings by severity', () => {
    expect(countFindings([
      { checkId: 'a', severity: 'blocking', reason: '', fixHint: '' },
      { checkId: 'b', severity: 'advisory', reason: '', fixHint: '' },
      { checkId: 'c', severity: 'blocking', reason: '', fixHint: '' },
    ])).toEqual({ blocking: 2, advisory: 1, inReview: 0 })
    // A document waiting for review is counted apart: it is the office's to act on, not the pilot's.
    expect(countFindings([{ checkId: 'documents.required', severity: 'blocking', awaiting: 'review', reason: '', fixHint: '' }])).toEqual({ blocking: 0, advisory: 0, inReview: 1 })
  })
})

describe('the field from what it reads of each entry', () => {
  // What loadCompetitionDossiers reads of every entry when it reads only a few dossiers in full.
  const slim = (entries: FindingsEntryRow[], units: FindingsUnitRow[]): [FindingsFieldEntry[], FindingsFieldRadioId[]] => [
    entries.map(e => [e.id, e.comp_id, e.status]),
    units.filter(u => u.kind === 'collision-warning' && u.radio_id !== null).map(u => [u.entry_id, u.radio_id!]),
  ]

  it('is the field the engine builds from the full dossiers', () => {
    const entries = [
      entry(),
      entry({ id: 'e2', comp_id: 'T3', status: 'accepted' }),
      entry({ id: 'e3', comp_id: 'k7', status: 'withdrawn' }),
      entry({ id: 'e4', comp_id: 'R4', status: 'rejected' }),
      entry({ id: 'e5', comp_id: 'M5', status: 'draft' }),
    ]
    const units = [
      warner(),
      recorder,
      warner({ id: 'u3', entry_id: 'e2', radio_id: 'abc123' }),
      warner({ id: 'u4', entry_id: 'e2', radio_id: 'DEF456' }),
      warner({ id: 'u5', entry_id: 'e3', radio_id: 'ABC123' }),
      warner({ id: 'u6', entry_id: 'e5', radio_id: '' }),
      warner({ id: 'u7', entry_id: 'e5', radio_id: null }),
      { ...recorder, id: 'u8', entry_id: 'e4' },
    ]
    const full = buildField(toDossiers(entries, units, [], []))
    expect(toField(...slim(entries, units))).toEqual(full)
    // Withdrawn and rejected entries claim nothing; the one whose units carry no radio ID holds none.
    expect(Object.keys(full.entries).sort()).toEqual(['e1', 'e2', 'e5'])
    expect(full.entries.e5!.radioIds).toEqual([])
  })

  it('finds the same radio-ID clash when one entry’s dossier is evaluated against it', () => {
    const entries = [entry({ status: 'accepted' }), entry({ id: 'e2', comp_id: 'T3', status: 'accepted' })]
    const units = [warner(), recorder, warner({ id: 'u3', entry_id: 'e2', radio_id: 'abc123' })]
    const [mine] = toDossiers([entries[0]!], [warner(), recorder], [], [])
    const viaFull = evaluate(mine!, competition, buildField(toDossiers(entries, units, [], []))).filter(f => f.checkId.startsWith('radio-id'))
    const viaSlim = evaluate(mine!, competition, toField(...slim(entries, units))).filter(f => f.checkId.startsWith('radio-id'))
    expect(viaFull.length).toBeGreaterThan(0)
    expect(viaSlim).toEqual(viaFull)
  })
})
