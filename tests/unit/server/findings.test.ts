// Rows as the database gives them → the check engine's dossiers and competition, then the
// engine over them: the mapping keeps every value the checks read.
import { describe, expect, it } from 'vitest'
import { DEFAULT_RULES } from '../../../shared/schemas/competition'
import { buildField, evaluate } from '../../../shared/engine'
import {
  classKey, countFindings, toDossiers, toEngineCompetition, toEngineIgcFile, toEngineUnit,
  type FindingsEntryRow, type FindingsIgcRow, type FindingsUnitRow,
} from '../../../server/utils/findings'

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
    expect(competition.classLimits).toEqual({ 'standard': { maxMtomKg: 525 }, 'custom:c9': { maxMtomKg: null } })
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
    expect(toEngineUnit(recorder)).toEqual({ id: 'u2', kind: 'flight-recorder', model: 'Logger', serial: 'FR1', firmwareVersion: '2.1', approvalLevel: 'all-flights' })
  })

  it('reads the IGC header fields, and drops a file whose recorder is gone', () => {
    expect(toEngineIgcFile(igc())).toMatchObject({ unitId: 'u2', gliderId: 'd1234', competitionId: 'k7', competitionClass: 'Standard', hasGRecord: true, uploadedAt: '2027-05-02T10:00:00.000Z' })
    expect(toEngineIgcFile(igc({ unit_id: null }))).toBeNull()
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

  it('counts findings by severity', () => {
    expect(countFindings([
      { checkId: 'a', severity: 'blocking', reason: '', fixHint: '' },
      { checkId: 'b', severity: 'advisory', reason: '', fixHint: '' },
      { checkId: 'c', severity: 'blocking', reason: '', fixHint: '' },
    ])).toEqual({ blocking: 2, advisory: 1 })
  })
})
