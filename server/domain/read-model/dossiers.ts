// The dossiers as the check engine reads them (shared/engine), from the database: the one
// loader every reader goes through — the entry page and the findings, the board, the grid
// check and the phone's grid pack. One statement reads the competition (with its classes and
// firmware catalogue), the entries in scope with their units, current documents, current IGC
// files, weigh-ins and, for a day, that day's latest grid check, and the two slim lists the
// field of every entry is built from; then pure row → engine mappings.
import type { Knex } from 'knex'
import { buildField, type ClassLimit, type CompetitionForEngine, type Dossier, type EngineDocument, type EngineEntry, type EngineIgcFile, type EngineUnit, type Field, type FirmwareRelease, type GridCheck, type IsoDate, type ScaleReading, type WeighInRecord, type WeighUnits } from '#shared/engine'
import type { EntryStatus, PaymentStatus } from '#shared/constants/entries'
import { rulesOf } from '#shared/utils/rules'
import { useDb } from '#server/utils/db'
import { latestGridCheckIds } from './day-inputs'
import { num } from './values'

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

// ---------------------------------------------------------------------------------------
// Loading

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

/** What the field reads of every entry: [id, competition ID, status]. */
export type FindingsFieldEntry = [id: string, compId: string, status: EntryStatus]
/** …and of every collision-warning unit with a radio ID: [entry id, radio ID]. */
export type FindingsFieldRadioId = [entryId: string, radioId: string]

/**
 * The field of a competition from what it reads of each entry: the engine's own buildField,
 * over dossiers that hold only the entry's id, competition ID and status and its
 * collision-warning units' radio IDs (tests/unit/server/findings.test.ts holds the result
 * equal to buildField over the full dossiers), so a few entries' dossiers need no other entry
 * read in full.
 */
export function toField(entries: readonly FindingsFieldEntry[], radioIds: readonly FindingsFieldRadioId[]): Field {
  const units = new Map<string, { kind: 'collision-warning', radioId: string }[]>()
  for (const [entryId, radioId] of radioIds) {
    const list = units.get(entryId)
    if (list) list.push({ kind: 'collision-warning', radioId })
    else units.set(entryId, [{ kind: 'collision-warning', radioId }])
  }
  return buildField(entries.map(([id, compId, status]) => ({
    entry: { id, compId, status },
    units: units.get(id) ?? [],
  }) as unknown as Dossier))
}

/**
 * The statement that reads the dossiers of a competition's entries in `scope`, each part a
 * JSON value with the columns the row types above name (numerics as their text, dates as
 * YYYY-MM-DD): one round trip, whatever the scope — what a grid check, a director's action or
 * an entry's page waits for. The field always covers the whole competition, from two slim lists.
 */
function dossierSql(scope: { ids: boolean, acceptedOnly: boolean, day: boolean }): string {
  const inScope = (column: string) => [
    scope.ids ? `and ${column} = any(:ids::uuid[])` : '',
    scope.acceptedOnly ? `and ${column} in (select id from entries where competition_id = :competitionId and status = 'accepted')` : '',
  ].join(' ')
  return `select
  (select json_build_object('name', c.name, 'time_zone', c.time_zone, 'settings', c.settings,
      'first_contest_day', c.first_contest_day, 'last_contest_day', c.last_contest_day)
    from competitions c where c.id = :competitionId) as competition,
  (select coalesce(json_agg(json_build_object('id', k.id, 'code', k.code, 'max_mtom_kg', k.max_mtom_kg::text)), '[]')
    from classes k where k.competition_id = :competitionId) as classes,
  (select coalesce(json_agg(json_build_object('unit_family', f.unit_family, 'version', f.version, 'expires_on', f.expires_on)), '[]')
    from firmware_releases f where f.competition_id = :competitionId) as firmware,
  (select coalesce(json_agg(json_build_array(e.id, e.comp_id, e.status)), '[]')
    from entries e where e.competition_id = :competitionId) as field_entries,
  (select coalesce(json_agg(json_build_array(u.entry_id, u.radio_id)), '[]')
    from units u where u.competition_id = :competitionId and u.kind = 'collision-warning' and u.radio_id is not null) as field_radio_ids,
  (select coalesce(json_agg(json_build_object(
      'id', e.id, 'comp_id', e.comp_id, 'registration', e.registration, 'glider_type', e.glider_type, 'pilot_name', e.pilot_name,
      'copilot_name', e.copilot_name, 'status', e.status, 'payment_status', e.payment_status, 'mtom_kg', e.mtom_kg::text,
      'cg_forward_limit_m', e.cg_forward_limit_m::text, 'cg_aft_limit_m', e.cg_aft_limit_m::text,
      'class_id', e.class_id, 'class_name', k.name, 'class_code', k.code) order by e.comp_id, e.id), '[]')
    from entries e join classes k on k.id = e.class_id
    where e.competition_id = :competitionId ${inScope('e.id')}) as entries,
  (select coalesce(json_agg(json_build_object(
      'id', u.id, 'entry_id', u.entry_id, 'kind', u.kind, 'model', u.model, 'serial', u.serial, 'radio_id', u.radio_id,
      'firmware_version', u.firmware_version, 'approval_level', u.approval_level, 'firmware_expires_on', u.firmware_expires_on,
      'firmware_updated_on', u.firmware_updated_on, 'obstacle_db_expires_on', u.obstacle_db_expires_on) order by u.kind, u.created_at, u.id), '[]')
    from units u where u.competition_id = :competitionId ${inScope('u.entry_id')}) as units,
  (select coalesce(json_agg(json_build_object(
      'id', d.id, 'entry_id', d.entry_id, 'kind', d.kind, 'status', d.status, 'expires_on', d.expires_on) order by d.uploaded_at), '[]')
    from documents d where d.competition_id = :competitionId and not d.superseded ${inScope('d.entry_id')}) as documents,
  (select coalesce(json_agg(json_build_object(
      'id', i.id, 'entry_id', i.entry_id, 'unit_id', i.unit_id, 'pilot', i.pilot, 'copilot', i.copilot, 'glider_type', i.glider_type,
      'glider_id', i.glider_id, 'declared_comp_id', i.declared_comp_id, 'declared_class', i.declared_class, 'has_g_record', i.has_g_record,
      'uploaded_at', i.uploaded_at, 'flight_date', i.flight_date) order by i.uploaded_at), '[]')
    from igc_files i where i.competition_id = :competitionId and not i.superseded ${inScope('i.entry_id')}) as igc_files,
  -- Within a day the engine takes the last weigh-in it is given: order by the time of the grid
  -- check it came with, so the later check's weighing counts.
  (select coalesce(json_agg(json_build_object(
      'id', w.id, 'entry_id', w.entry_id, 'units', w.units, 'readings', w.readings, 'weighed_on', w.weighed_on)
      order by w.weighed_on, g.checked_at, w.created_at, w.id), '[]')
    from weigh_ins w left join grid_checks g on g.id = w.grid_check_id
    where w.competition_id = :competitionId ${inScope('w.entry_id')}) as weigh_ins,
  ${scope.day
    ? `(select coalesce(json_agg(json_build_object('entry_id', g.entry_id, 'outcome', g.outcome, 'day', g.day)), '[]')
      from grid_checks g where g.id in (:latestChecks) ${inScope('g.entry_id')})`
    : `'[]'::json`} as grid_checks`
}

/** The row `dossierStatement` reads: each part of the dossiers in scope as a JSON value. */
export interface DossierSqlRow {
  competition: (FindingsCompetitionRow & { name: string }) | null
  classes: FindingsClassRow[]
  firmware: FindingsFirmwareRow[]
  field_entries: FindingsFieldEntry[]
  field_radio_ids: FindingsFieldRadioId[]
  entries: FindingsEntryRow[]
  units: FindingsUnitRow[]
  documents: FindingsDocumentRow[]
  igc_files: (Omit<FindingsIgcRow, 'uploaded_at'> & { uploaded_at: string })[]
  weigh_ins: FindingsWeighInRow[]
  grid_checks: FindingsGridCheckRow[]
}

/**
 * The statement that reads the dossiers in `scope` and its named bindings, for a caller that
 * reads them beside other parts in one round trip (the grid check): the statement is a derived
 * table whose one row is a `DossierSqlRow`; `dossiersOf` reads that row.
 */
export function dossierStatement(db: Knex, competitionId: string, scope: DossierScope = {}): { sql: string, bindings: Record<string, unknown> } {
  const bindings: Record<string, unknown> = { competitionId }
  if (scope.entryIds) bindings.ids = [...scope.entryIds]
  if (scope.day) bindings.latestChecks = latestGridCheckIds(db, competitionId, scope.day)
  return { sql: dossierSql({ ids: Boolean(scope.entryIds), acceptedOnly: Boolean(scope.acceptedOnly), day: Boolean(scope.day) }), bindings }
}

/** The dossiers from the row `dossierStatement` read; undefined when there is no such competition. */
export function dossiersOf(row: DossierSqlRow | undefined): CompetitionDossiers | undefined {
  const competition = row?.competition
  if (!row || !competition) return undefined
  // As the driver reads a timestamptz column: a Date (to the millisecond).
  const igcFiles: FindingsIgcRow[] = row.igc_files.map(f => ({ ...f, uploaded_at: new Date(f.uploaded_at) }))
  const dossiers = toDossiers(row.entries, row.units, row.documents, igcFiles, row.weigh_ins, row.grid_checks)
  return {
    competitionRow: competition,
    competition: toEngineCompetition(competition, row.classes, row.firmware),
    dossiers,
    field: toField(row.field_entries, row.field_radio_ids),
    rows: row.entries,
  }
}

/**
 * The dossiers of one competition's entries in `scope` (every entry when it names none), in
 * the order of their competition IDs, with the field of the whole competition. Undefined when
 * there is no such competition.
 */
export async function loadCompetitionDossiers(competitionId: string, scope: DossierScope = {}, db: Knex = useDb()): Promise<CompetitionDossiers | undefined> {
  const { sql, bindings } = dossierStatement(db, competitionId, scope)
  const { rows: [row] } = await db.raw(sql, bindings) as { rows: DossierSqlRow[] }
  return dossiersOf(row)
}
