// Findings: the check engine (shared/engine) run over dossiers read from the database.
// A few set-based queries per competition — entries with their class, units, current
// documents, current IGC files, the competition with its classes and firmware catalogue —
// weigh-ins and, for a day, that day's latest grid check — then pure row → engine mappings,
// the field of every entry, and evaluate. `loadCompetitionDossiers` is the loader both the
// findings routes and the grid pack read through.
import type { Knex } from 'knex'
import { blockingFirst, buildField, evaluate, type ClassLimit, type CompetitionForEngine, type Dossier, type EngineDocument, type EngineEntry, type EngineIgcFile, type EngineUnit, type Field, type Finding, type FirmwareRelease, type GridCheck, type IsoDate, type ScaleReading, type WeighInRecord, type WeighUnits } from '#shared/engine'
import type { CompetitionFindings, EntryFindings, FindingCounts } from '#shared/types/api-findings'
import type { EntryStatus, PaymentStatus } from '#shared/constants/entries'
import { rulesOf } from './competition-setup'

// ---------------------------------------------------------------------------------------
// Rows as the queries below select them (dates as YYYY-MM-DD text, numerics as pg strings).

export interface FindingsEntryRow {
  id: string
  comp_id: string
  registration: string
  glider_type: string
  pilot_name: string
  copilot_name: string | null
  status: EntryStatus
  payment_status: PaymentStatus
  mtom_kg: string | number | null
  cg_forward_limit_m: string | number | null
  cg_aft_limit_m: string | number | null
  class_id: string
  class_name: string
  class_code: string
}

export interface FindingsUnitRow {
  id: string
  entry_id: string
  kind: 'collision-warning' | 'flight-recorder'
  model: string
  serial: string | null
  radio_id: string | null
  firmware_version: string | null
  firmware_expires_on: string | null
  firmware_updated_on: string | null
  obstacle_db_expires_on: string | null
  approval_level: string | null
}

export interface FindingsDocumentRow {
  id: string
  entry_id: string
  kind: EngineDocument['kind']
  status: EngineDocument['status']
  expires_on: string | null
}

export interface FindingsIgcRow {
  id: string
  entry_id: string
  unit_id: string | null
  flight_date: string | null
  pilot: string | null
  copilot: string | null
  glider_type: string | null
  glider_id: string | null
  declared_comp_id: string | null
  declared_class: string | null
  has_g_record: boolean
  uploaded_at: Date | string
}

export interface FindingsCompetitionRow {
  time_zone: string
  first_contest_day: string | null
  last_contest_day: string | null
  settings: Record<string, unknown> | null
}

export interface FindingsWeighInRow {
  id: string
  entry_id: string
  weighed_on: string
  units: WeighUnits
  readings: ScaleReading[]
}

/** The latest grid check of an entry on the evaluated day. */
export interface FindingsGridCheckRow {
  entry_id: string
  day: string
  outcome: 'pass' | 'fail'
}

export interface FindingsClassRow {
  id: string
  code: string
  max_mtom_kg: string | number | null
}

export interface FindingsFirmwareRow {
  unit_family: string
  version: string
  expires_on: string
}

// ---------------------------------------------------------------------------------------
// Pure mappings

const num = (v: string | number | null | undefined): number | null => (v === null || v === undefined || v === '' ? null : Number(v))

/**
 * The engine's key for a class: its FAI code, or `custom:<id>` for a custom class, so two
 * custom classes of one competition keep their own limits.
 */
export function classKey(code: string, classId: string): string {
  return code === 'custom' ? `custom:${classId}` : code
}

export function toEngineEntry(r: FindingsEntryRow): EngineEntry {
  return {
    id: r.id,
    compId: r.comp_id,
    registration: r.registration,
    gliderType: r.glider_type,
    pilotName: r.pilot_name,
    copilotName: r.copilot_name,
    className: r.class_name,
    classCode: classKey(r.class_code, r.class_id),
    status: r.status,
    mtomKg: num(r.mtom_kg),
    cgForwardLimitM: num(r.cg_forward_limit_m),
    cgAftLimitM: num(r.cg_aft_limit_m),
  }
}

export function toEngineUnit(r: FindingsUnitRow): EngineUnit {
  if (r.kind === 'collision-warning') {
    return {
      id: r.id,
      kind: 'collision-warning',
      model: r.model,
      serial: r.serial,
      radioId: r.radio_id,
      firmwareVersion: r.firmware_version,
      firmwareExpiresOn: r.firmware_expires_on,
      firmwareUpdatedOn: r.firmware_updated_on,
      obstacleDbExpiresOn: r.obstacle_db_expires_on,
    }
  }
  return {
    id: r.id,
    kind: 'flight-recorder',
    model: r.model,
    serial: r.serial ?? '',
    firmwareVersion: r.firmware_version,
    approvalLevel: r.approval_level,
  }
}

export function toEngineDocument(r: FindingsDocumentRow): EngineDocument {
  return { id: r.id, kind: r.kind, status: r.status, expiresOn: r.expires_on }
}

/** An IGC file no longer tied to a unit (the unit was deleted) speaks for no recorder: null. */
export function toEngineIgcFile(r: FindingsIgcRow): EngineIgcFile | null {
  if (!r.unit_id) return null
  return {
    id: r.id,
    unitId: r.unit_id,
    flightDate: r.flight_date,
    pilot: r.pilot,
    copilot: r.copilot,
    gliderType: r.glider_type,
    gliderId: r.glider_id,
    competitionId: r.declared_comp_id,
    competitionClass: r.declared_class,
    hasGRecord: r.has_g_record,
    uploadedAt: r.uploaded_at instanceof Date ? r.uploaded_at.toISOString() : String(r.uploaded_at),
  }
}

/**
 * The competition as the engine reads it; null while it has no contest days (nothing to
 * check dates against).
 */
export function toEngineCompetition(c: FindingsCompetitionRow, classes: FindingsClassRow[], firmware: FindingsFirmwareRow[]): CompetitionForEngine | null {
  if (!c.first_contest_day || !c.last_contest_day) return null
  const classLimits: Record<string, ClassLimit> = {}
  for (const k of classes) classLimits[classKey(k.code, k.id)] = { maxMtomKg: num(k.max_mtom_kg) }
  const firmwareCatalogue: FirmwareRelease[] = firmware.map(f => ({ family: f.unit_family, version: f.version, expiresOn: f.expires_on }))
  return {
    firstContestDay: c.first_contest_day,
    lastContestDay: c.last_contest_day,
    timeZone: c.time_zone,
    rules: rulesOf(c.settings),
    classLimits,
    firmwareCatalogue,
  }
}

export function toWeighInRecord(r: FindingsWeighInRow): WeighInRecord {
  return { id: r.id, weighedOn: r.weighed_on, units: r.units, readings: r.readings.map(x => ({ point: x.point, weight: Number(x.weight), arm: Number(x.arm) })) }
}

/**
 * One dossier per entry row, from the rows of its units, documents, IGC files, weigh-ins (in
 * the order the engine reads them: the last of a day counts) and the day's latest grid check.
 */
export function toDossiers(
  entries: FindingsEntryRow[],
  units: FindingsUnitRow[],
  documents: FindingsDocumentRow[],
  igcFiles: FindingsIgcRow[],
  weighIns: FindingsWeighInRow[] = [],
  gridChecks: FindingsGridCheckRow[] = [],
): Dossier[] {
  const byEntry = new Map<string, Dossier>()
  const out: Dossier[] = []
  for (const r of entries) {
    const d: Dossier = { entry: toEngineEntry(r), units: [], documents: [], igcFiles: [], payment: { status: r.payment_status }, weighIns: [] }
    byEntry.set(r.id, d)
    out.push(d)
  }
  for (const u of units) byEntry.get(u.entry_id)?.units.push(toEngineUnit(u))
  for (const doc of documents) byEntry.get(doc.entry_id)?.documents.push(toEngineDocument(doc))
  for (const f of igcFiles) {
    const file = toEngineIgcFile(f)
    if (file) byEntry.get(f.entry_id)?.igcFiles.push(file)
  }
  for (const w of weighIns) byEntry.get(w.entry_id)?.weighIns.push(toWeighInRecord(w))
  for (const g of gridChecks) {
    const d = byEntry.get(g.entry_id)
    if (d) d.gridCheck = { day: g.day, outcome: g.outcome } satisfies GridCheck
  }
  return out
}

export function countFindings(findings: readonly Finding[]): FindingCounts {
  let blocking = 0
  for (const f of findings) if (f.severity === 'blocking') blocking++
  return { blocking, advisory: findings.length - blocking }
}

// ---------------------------------------------------------------------------------------
// Loading and evaluating

export interface EvaluatedEntry {
  row: FindingsEntryRow
  findings: Finding[]
}

export interface DossierScope {
  /** Only these entries' dossiers (the field still holds every entry). */
  entryIds?: readonly string[]
  /** Only accepted entries' dossiers (the grid). */
  acceptedOnly?: boolean
  /** The contest day: dossiers carry that day's latest grid check. */
  day?: IsoDate
}

export interface CompetitionDossiers {
  competitionRow: FindingsCompetitionRow & { name: string }
  /** Null while the competition has no contest days (nothing to check dates against). */
  competition: CompetitionForEngine | null
  /** The dossiers in scope, in competition-ID order. */
  dossiers: Dossier[]
  /** Every entry of the competition, for the uniqueness checks. */
  field: Field
  /** The entry rows of the dossiers in scope, in the same order. */
  rows: FindingsEntryRow[]
}

/**
 * Reads the dossiers of one competition in a few set-based queries. Documents, IGC files,
 * weigh-ins and grid checks are read only for the entries in scope; entries and units for
 * all, so the field sees the whole competition. Undefined when there is no such competition.
 */
export async function loadCompetitionDossiers(competitionId: string, scope: DossierScope = {}, db: Knex = useDb()): Promise<CompetitionDossiers | undefined> {
  const only = scope.entryIds ? [...scope.entryIds] : null
  const scoped = (q: Knex.QueryBuilder, column = 'entry_id') => {
    if (only) q.whereIn(column, only)
    if (scope.acceptedOnly) q.whereIn(column, db('entries').where({ competition_id: competitionId, status: 'accepted' }).select('id'))
    return q
  }
  const nothing = Promise.resolve([])
  const [competition, classes, firmware, entries, units, documents, igcFiles, weighIns, gridChecks] = await Promise.all([
    db('competitions').where({ id: competitionId }).first(
      'name', 'time_zone', 'settings',
      db.raw(`to_char(first_contest_day, 'YYYY-MM-DD') as first_contest_day`),
      db.raw(`to_char(last_contest_day, 'YYYY-MM-DD') as last_contest_day`),
    ) as Promise<(FindingsCompetitionRow & { name: string }) | undefined>,
    db('classes').where({ competition_id: competitionId }).select('id', 'code', 'max_mtom_kg') as Promise<FindingsClassRow[]>,
    db('firmware_releases').where({ competition_id: competitionId }).select('unit_family', 'version', db.raw(`to_char(expires_on, 'YYYY-MM-DD') as expires_on`)) as Promise<FindingsFirmwareRow[]>,
    db('entries as e').join('classes as k', 'k.id', 'e.class_id').where('e.competition_id', competitionId)
      .orderBy([{ column: 'e.comp_id' }, { column: 'e.id' }])
      .select(
        'e.id', 'e.comp_id', 'e.registration', 'e.glider_type', 'e.pilot_name', 'e.copilot_name', 'e.status', 'e.payment_status',
        'e.mtom_kg', 'e.cg_forward_limit_m', 'e.cg_aft_limit_m', 'e.class_id', 'k.name as class_name', 'k.code as class_code',
      ) as Promise<FindingsEntryRow[]>,
    db('units').where({ competition_id: competitionId }).orderBy([{ column: 'kind' }, { column: 'created_at' }, { column: 'id' }]).select(
      'id', 'entry_id', 'kind', 'model', 'serial', 'radio_id', 'firmware_version', 'approval_level',
      db.raw(`to_char(firmware_expires_on, 'YYYY-MM-DD') as firmware_expires_on`),
      db.raw(`to_char(firmware_updated_on, 'YYYY-MM-DD') as firmware_updated_on`),
      db.raw(`to_char(obstacle_db_expires_on, 'YYYY-MM-DD') as obstacle_db_expires_on`),
    ) as Promise<FindingsUnitRow[]>,
    scoped(db('documents').where({ competition_id: competitionId, superseded: false })).orderBy('uploaded_at').select(
      'id', 'entry_id', 'kind', 'status', db.raw(`to_char(expires_on, 'YYYY-MM-DD') as expires_on`),
    ) as Promise<FindingsDocumentRow[]>,
    scoped(db('igc_files').where({ competition_id: competitionId, superseded: false })).orderBy('uploaded_at').select(
      'id', 'entry_id', 'unit_id', 'pilot', 'copilot', 'glider_type', 'glider_id', 'declared_comp_id', 'declared_class', 'has_g_record', 'uploaded_at',
      db.raw(`to_char(flight_date, 'YYYY-MM-DD') as flight_date`),
    ) as Promise<FindingsIgcRow[]>,
    // Within a day the engine takes the last weigh-in it is given: order by the time of the
    // grid check it came with, so the later check's weighing counts.
    scoped(db('weigh_ins as w').leftJoin('grid_checks as g', 'g.id', 'w.grid_check_id').where('w.competition_id', competitionId), 'w.entry_id')
      .orderBy([{ column: 'w.weighed_on' }, { column: 'g.checked_at' }, { column: 'w.created_at' }, { column: 'w.id' }])
      .select('w.id', 'w.entry_id', 'w.units', 'w.readings', db.raw(`to_char(w.weighed_on, 'YYYY-MM-DD') as weighed_on`)) as Promise<FindingsWeighInRow[]>,
    scope.day
      ? scoped(db('grid_checks').whereIn('id', latestGridCheckIds(db, competitionId, scope.day)))
          .select('entry_id', 'outcome', db.raw(`to_char(day, 'YYYY-MM-DD') as day`)) as Promise<FindingsGridCheckRow[]>
      : nothing as Promise<FindingsGridCheckRow[]>,
  ])
  if (!competition) return undefined
  const all = toDossiers(entries, units, documents, igcFiles, weighIns, gridChecks)
  const field = buildField(all)
  const wanted = only ? new Set(only) : null
  const inScope = (r: FindingsEntryRow) => (!wanted || wanted.has(r.id)) && (!scope.acceptedOnly || r.status === 'accepted')
  const dossiers: Dossier[] = []
  const rows: FindingsEntryRow[] = []
  entries.forEach((r, i) => {
    if (!inScope(r)) return
    rows.push(r)
    dossiers.push(all[i]!)
  })
  return { competitionRow: competition, competition: toEngineCompetition(competition, classes, firmware), dossiers, field, rows }
}

/**
 * Evaluates the entries of one competition: every entry, or only `entryIds` (the field
 * still holds every entry, so uniqueness checks see the whole competition). Entries in the
 * order of their competition ID.
 */
export async function evaluateCompetition(competitionId: string, entryIds?: readonly string[], db: Knex = useDb()): Promise<EvaluatedEntry[]> {
  if (entryIds && !entryIds.length) return []
  const loaded = await loadCompetitionDossiers(competitionId, { entryIds }, db)
  if (!loaded) return []
  const { competition, dossiers, field, rows } = loaded
  return dossiers.map((d, i) => ({ row: rows[i]!, findings: competition ? blockingFirst(evaluate(d, competition, field)) : [] }))
}

/** The findings of one entry (blocking first). */
export async function entryFindings(competitionId: string, entryId: string, db: Knex = useDb()): Promise<EntryFindings> {
  const [hit] = await evaluateCompetition(competitionId, [entryId], db)
  const findings = hit?.findings ?? []
  return { entryId, findings, ...countFindings(findings) }
}

/** Findings by entry id for some entries of one competition (all when entryIds is left out). */
export async function findingsByEntry(competitionId: string, entryIds?: readonly string[], db: Knex = useDb()): Promise<Map<string, Finding[]>> {
  const evaluated = await evaluateCompetition(competitionId, entryIds, db)
  return new Map(evaluated.map(e => [e.row.id, e.findings]))
}

/** The whole competition for its staff: findings by entry, counts by check and severity. */
export function summariseFindings(evaluated: readonly EvaluatedEntry[]): CompetitionFindings {
  const byCheck: CompetitionFindings['byCheck'] = {}
  const bySeverity = { blocking: 0, advisory: 0 }
  const entries = evaluated.map(({ row, findings }) => {
    for (const f of findings) {
      const c = (byCheck[f.checkId] ??= { blocking: 0, advisory: 0 })
      c[f.severity]++
      bySeverity[f.severity]++
    }
    return { entryId: row.id, compId: row.comp_id, pilotName: row.pilot_name, status: row.status, findings, ...countFindings(findings) }
  })
  return { entries, byCheck, bySeverity }
}
