// Findings: the check engine (shared/engine) run over dossiers read from the database.
// A few set-based queries per competition — entries with their class, units, current
// documents, current IGC files, the competition with its classes and firmware catalogue —
// weigh-ins and, for a day, that day's latest grid check — then pure row → engine mappings,
// the field of every entry, and evaluate; a few entries' dossiers in one statement.
// `loadCompetitionDossiers` is the loader the findings routes, the grid pack, the grid check
// and the board read through.
import type { Knex } from 'knex'
import { blockingFirst, buildField, evaluate, type ClassLimit, type CompetitionForEngine, type Dossier, type EngineDocument, type EngineEntry, type EngineIgcFile, type EngineUnit, type Field, type Finding, type FirmwareRelease, type GridCheck, type IsoDate, type ScaleReading, type WeighInRecord, type WeighUnits } from '#shared/engine'
import type { CompetitionFindings, EntryFindings, FindingCounts } from '#shared/types/api-findings'
import type { EntryStatus, PaymentStatus } from '#shared/constants/entries'
import { rulesOf } from './competition-setup'
import { together } from './db'
import { latestGridCheckIds } from './grid-checks'

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

const YMD = `'YYYY-MM-DD'`

/**
 * One statement for what `loadCompetitionDossiers` reads for a few entries (:ids), each part a
 * JSON value with the columns the row types above name (numerics as their text, dates as
 * YYYY-MM-DD), so an entry's dossier costs one round trip to the database, not nine — what a
 * grid check, a director's action or an entry's page waits for. The field still covers the
 * whole competition, from two slim lists.
 */
function scopedDossierSql(scope: { acceptedOnly: boolean, day: boolean }): string {
  const inScope = (column: string) => `and ${column} = any(:ids::uuid[])${scope.acceptedOnly
    ? ` and ${column} in (select id from entries where competition_id = :competitionId and status = 'accepted')`
    : ''}`
  return `select
  (select json_build_object('name', c.name, 'time_zone', c.time_zone, 'settings', c.settings,
      'first_contest_day', to_char(c.first_contest_day, ${YMD}), 'last_contest_day', to_char(c.last_contest_day, ${YMD}))
    from competitions c where c.id = :competitionId) as competition,
  (select coalesce(json_agg(json_build_object('id', k.id, 'code', k.code, 'max_mtom_kg', k.max_mtom_kg::text)), '[]')
    from classes k where k.competition_id = :competitionId) as classes,
  (select coalesce(json_agg(json_build_object('unit_family', f.unit_family, 'version', f.version, 'expires_on', to_char(f.expires_on, ${YMD}))), '[]')
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
      'firmware_version', u.firmware_version, 'approval_level', u.approval_level,
      'firmware_expires_on', to_char(u.firmware_expires_on, ${YMD}), 'firmware_updated_on', to_char(u.firmware_updated_on, ${YMD}),
      'obstacle_db_expires_on', to_char(u.obstacle_db_expires_on, ${YMD})) order by u.kind, u.created_at, u.id), '[]')
    from units u where u.competition_id = :competitionId ${inScope('u.entry_id')}) as units,
  (select coalesce(json_agg(json_build_object(
      'id', d.id, 'entry_id', d.entry_id, 'kind', d.kind, 'status', d.status, 'expires_on', to_char(d.expires_on, ${YMD})) order by d.uploaded_at), '[]')
    from documents d where d.competition_id = :competitionId and not d.superseded ${inScope('d.entry_id')}) as documents,
  (select coalesce(json_agg(json_build_object(
      'id', i.id, 'entry_id', i.entry_id, 'unit_id', i.unit_id, 'pilot', i.pilot, 'copilot', i.copilot, 'glider_type', i.glider_type,
      'glider_id', i.glider_id, 'declared_comp_id', i.declared_comp_id, 'declared_class', i.declared_class, 'has_g_record', i.has_g_record,
      'uploaded_at', i.uploaded_at, 'flight_date', to_char(i.flight_date, ${YMD})) order by i.uploaded_at), '[]')
    from igc_files i where i.competition_id = :competitionId and not i.superseded ${inScope('i.entry_id')}) as igc_files,
  -- Within a day the engine takes the last weigh-in it is given: order by the time of the grid
  -- check it came with, so the later check's weighing counts.
  (select coalesce(json_agg(json_build_object(
      'id', w.id, 'entry_id', w.entry_id, 'units', w.units, 'readings', w.readings, 'weighed_on', to_char(w.weighed_on, ${YMD}))
      order by w.weighed_on, g.checked_at, w.created_at, w.id), '[]')
    from weigh_ins w left join grid_checks g on g.id = w.grid_check_id
    where w.competition_id = :competitionId ${inScope('w.entry_id')}) as weigh_ins,
  ${scope.day
    ? `(select coalesce(json_agg(json_build_object('entry_id', g.entry_id, 'outcome', g.outcome, 'day', to_char(g.day, ${YMD}))), '[]')
      from grid_checks g where g.id in (:latestChecks) ${inScope('g.entry_id')})`
    : `'[]'::json`} as grid_checks`
}

/** The row `scopedDossierSql` reads: each part of some entries' dossiers as a JSON value. */
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
 * The statement that reads some entries' dossiers (`entryIds`) and its named bindings, for a
 * caller that reads them beside other parts in one round trip (the grid check): the statement
 * is a derived table whose one row is a `DossierSqlRow`; `scopedDossiersOf` reads that row.
 */
export function scopedDossierStatement(db: Knex, competitionId: string, entryIds: readonly string[], scope: Omit<DossierScope, 'entryIds'> = {}): { sql: string, bindings: Record<string, unknown> } {
  const bindings: Record<string, unknown> = { competitionId, ids: [...entryIds] }
  if (scope.day) bindings.latestChecks = latestGridCheckIds(db, competitionId, scope.day)
  return { sql: scopedDossierSql({ acceptedOnly: Boolean(scope.acceptedOnly), day: Boolean(scope.day) }), bindings }
}

/** Some entries' dossiers from the row `scopedDossierStatement` read; undefined when there is no such competition. */
export function scopedDossiersOf(row: DossierSqlRow | undefined): CompetitionDossiers | undefined {
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

async function loadScopedDossiers(competitionId: string, entryIds: readonly string[], scope: DossierScope, db: Knex): Promise<CompetitionDossiers | undefined> {
  const { sql, bindings } = scopedDossierStatement(db, competitionId, entryIds, scope)
  const { rows: [row] } = await db.raw(sql, bindings) as { rows: DossierSqlRow[] }
  return scopedDossiersOf(row)
}

/**
 * Reads the dossiers of one competition in a few set-based queries. Documents, IGC files,
 * weigh-ins and grid checks are read only for the entries in scope; entries and units for
 * all, so the field sees the whole competition. Undefined when there is no such competition.
 * Some entries' dossiers (`entryIds`) are read in one statement instead (loadScopedDossiers),
 * with the same result (tests/e2e/api/findings/dossier-loader.test.ts).
 */
export async function loadCompetitionDossiers(competitionId: string, scope: DossierScope = {}, db: Knex = useDb()): Promise<CompetitionDossiers | undefined> {
  if (scope.entryIds) return loadScopedDossiers(competitionId, scope.entryIds, scope, db)
  const scoped = (q: Knex.QueryBuilder, column = 'entry_id') => {
    if (scope.acceptedOnly) q.whereIn(column, db('entries').where({ competition_id: competitionId, status: 'accepted' }).select('id'))
    return q
  }
  const nothing = Promise.resolve([])
  const [competition, classes, firmware, entries, units, documents, igcFiles, weighIns, gridChecks] = await together(db, [
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
  ] as const)
  if (!competition) return undefined
  const all = toDossiers(entries, units, documents, igcFiles, weighIns, gridChecks)
  const field = buildField(all)
  const inScope = (r: FindingsEntryRow) => !scope.acceptedOnly || r.status === 'accepted'
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
