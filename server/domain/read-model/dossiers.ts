// The dossiers as the check engine reads them (shared/engine), from the database: the one
// loader every reader goes through — the entry page and the findings, the board, the grid
// check and the phone's grid pack. One statement reads the competition (with its classes and
// firmware catalogue), the entries in scope with their units, current documents, current IGC
// files, weigh-ins and, for a day, that day's latest grid check, and the two slim lists the
// field of every entry is built from; then pure row → engine mappings.
import type { Knex } from 'knex'
import { buildField, type ClassLimit, type MotorGliderKind, type CompetitionForEngine, type Dossier, type EngineDocument, type EngineEntry, type EngineIgcFile, type EngineUnit, type Field, type FirmwareRelease, type GridCheck, type IsoDate, type ScaleReading, type WeighInRecord, type WeighUnits } from '#shared/engine'
import type { EntryStatus, PaymentStatus } from '#shared/constants/entries'
import { rulesOf } from '#shared/utils/rules'
import { useDb } from '#server/utils/db'
import { latestGridCheckIds } from './day-inputs'
import { OWED_SQL } from './fees'
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
  /** What is still owed of the fee (minor units) and its currency, for the finding's words. */
  owed_minor?: number | null
  currency?: string | null
  mtom_kg: string | number | null
  cg_forward_limit_m: string | number | null
  cg_aft_limit_m: string | number | null
  span_m?: string | number | null
  motor_glider?: string | null
  pilot_mass_kg?: string | number | null
  copilot_mass_kg?: string | number | null
  pilot_arm_m?: string | number | null
  copilot_arm_m?: string | number | null
  ballast_arm_m?: string | number | null
  /** The last change of the accepted entry's dossier (ISO text), or null. */
  changed_after_acceptance_at?: string | null
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
  igc_recorder_id?: string | null
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
  original_filename?: string | null
  recorder_id?: string | null
  firmware_version?: string | null
  extensions?: string[] | null
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
  declared_ballast_kg?: string | number | null
}

/** The latest grid check of an entry on the evaluated day. */
export interface FindingsGridCheckRow {
  entry_id: string
  day: string
  outcome: 'pass' | 'fail'
  answers?: { itemId: string, result: string }[] | null
}

export interface FindingsClassRow {
  id: string
  code: string
  max_mtom_kg: string | number | null
  max_span_m?: string | number | null
  water_ballast?: boolean | null
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
    spanM: num(r.span_m),
    motorGlider: (r.motor_glider ?? 'none') as MotorGliderKind,
    pilotMassKg: num(r.pilot_mass_kg),
    copilotMassKg: num(r.copilot_mass_kg),
    pilotArmM: num(r.pilot_arm_m),
    copilotArmM: num(r.copilot_arm_m),
    ballastArmM: num(r.ballast_arm_m),
  }
}

export function toEnginePayment(r: FindingsEntryRow): Dossier['payment'] {
  return r.owed_minor === undefined || r.owed_minor === null
    ? { status: r.payment_status }
    : { status: r.payment_status, owedMinor: Number(r.owed_minor), currency: r.currency ?? undefined }
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
    igcRecorderId: r.igc_recorder_id ?? null,
  }
}

export function toEngineDocument(r: FindingsDocumentRow): EngineDocument {
  return { id: r.id, kind: r.kind, status: r.status, expiresOn: r.expires_on }
}

/** An IGC file; one tied to no recorder (uploaded without naming it, or its unit deleted) has unitId null. */
export function toEngineIgcFile(r: FindingsIgcRow): EngineIgcFile {
  return {
    id: r.id,
    unitId: r.unit_id,
    filename: r.original_filename ?? null,
    recorderId: r.recorder_id ?? null,
    firmwareVersion: r.firmware_version ?? null,
    extensions: r.extensions ?? [],
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
  for (const k of classes) {
    classLimits[classKey(k.code, k.id)] = { maxMtomKg: num(k.max_mtom_kg), maxSpanM: num(k.max_span_m), waterBallast: k.water_ballast ?? true }
  }
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
  return {
    id: r.id,
    weighedOn: r.weighed_on,
    units: r.units,
    readings: r.readings.map(x => ({ point: x.point, weight: Number(x.weight), arm: Number(x.arm) })),
    declaredBallastKg: num(r.declared_ballast_kg) ?? 0,
  }
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
    const d: Dossier = { entry: toEngineEntry(r), units: [], documents: [], igcFiles: [], payment: toEnginePayment(r), weighIns: [] }
    byEntry.set(r.id, d)
    out.push(d)
  }
  for (const u of units) byEntry.get(u.entry_id)?.units.push(toEngineUnit(u))
  for (const doc of documents) byEntry.get(doc.entry_id)?.documents.push(toEngineDocument(doc))
  for (const f of igcFiles) byEntry.get(f.entry_id)?.igcFiles.push(toEngineIgcFile(f))
  for (const w of weighIns) byEntry.get(w.entry_id)?.weighIns.push(toWeighInRecord(w))
  for (const g of gridChecks) {
    const d = byEntry.get(g.entry_id)
    if (d) d.gridCheck = { day: g.day, outcome: g.outcome, answers: (g.answers ?? []).map(a => ({ itemId: a.itemId, result: a.result })) } satisfies GridCheck
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
 * collision-warning units' radio IDs (tests/unit/server/domain/read-model/dossiers.test.ts holds the result
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

// ---------------------------------------------------------------------------------------
// The statement

/** One column of a part: the SQL that reads it, and the key its row type names it by. */
type Column = readonly [sql: string, key: string]

/**
 * The parts of a dossier read, each with its columns (numerics as their text, dates as
 * YYYY-MM-DD, timestamps as ISO text), the table it reads and the order the engine reads its
 * rows in. Each row travels as a small JSON array of these columns, in this order, and becomes
 * an object with the keys named here: one definition for the SQL and the row types above.
 */
const PARTS = {
  competition: {
    columns: [['c.name', 'name'], ['c.time_zone', 'time_zone'], ['c.settings', 'settings'], ['c.first_contest_day', 'first_contest_day'], ['c.last_contest_day', 'last_contest_day']],
    from: 'competitions c where c.id = :competitionId',
  },
  class: {
    columns: [['k.id', 'id'], ['k.code', 'code'], ['k.max_mtom_kg::text', 'max_mtom_kg'], ['k.max_span_m::text', 'max_span_m'], ['k.water_ballast', 'water_ballast']],
    from: 'classes k where k.competition_id = :competitionId',
  },
  firmware: {
    columns: [['f.unit_family', 'unit_family'], ['f.version', 'version'], ['f.expires_on', 'expires_on']],
    from: 'firmware_releases f where f.competition_id = :competitionId',
  },
  entry: {
    columns: [['e.id', 'id'], ['e.comp_id', 'comp_id'], ['e.registration', 'registration'], ['e.glider_type', 'glider_type'],
      ['e.pilot_name', 'pilot_name'], ['e.copilot_name', 'copilot_name'], ['e.status', 'status'], ['e.payment_status', 'payment_status'],
      ['e.mtom_kg::text', 'mtom_kg'], ['e.cg_forward_limit_m::text', 'cg_forward_limit_m'], ['e.cg_aft_limit_m::text', 'cg_aft_limit_m'],
      ['e.class_id', 'class_id'], ['k.name', 'class_name'], ['k.code', 'class_code'], ['e.span_m::text', 'span_m'], ['e.motor_glider', 'motor_glider'],
      ['e.pilot_mass_kg::text', 'pilot_mass_kg'], ['e.copilot_mass_kg::text', 'copilot_mass_kg'], ['e.pilot_arm_m::text', 'pilot_arm_m'],
      ['e.copilot_arm_m::text', 'copilot_arm_m'], ['e.ballast_arm_m::text', 'ballast_arm_m'], ['e.changed_after_acceptance_at', 'changed_after_acceptance_at'],
      [OWED_SQL, 'owed_minor'], ['c.currency', 'currency']],
    from: 'entries e join classes k on k.id = e.class_id join competitions c on c.id = e.competition_id where e.competition_id = :competitionId',
    order: 'e.comp_id, e.id',
    entry: 'e.id',
  },
  unit: {
    columns: [['u.id', 'id'], ['u.entry_id', 'entry_id'], ['u.kind', 'kind'], ['u.model', 'model'], ['u.serial', 'serial'],
      ['u.radio_id', 'radio_id'], ['u.firmware_version', 'firmware_version'], ['u.approval_level', 'approval_level'],
      ['u.firmware_expires_on', 'firmware_expires_on'], ['u.firmware_updated_on', 'firmware_updated_on'], ['u.obstacle_db_expires_on', 'obstacle_db_expires_on'],
      ['u.igc_recorder_id', 'igc_recorder_id']],
    from: 'units u where u.competition_id = :competitionId',
    order: 'u.kind, u.created_at, u.id',
    entry: 'u.entry_id',
  },
  document: {
    columns: [['d.id', 'id'], ['d.entry_id', 'entry_id'], ['d.kind', 'kind'], ['d.status', 'status'], ['d.expires_on', 'expires_on']],
    from: 'documents d where d.competition_id = :competitionId and not d.superseded',
    order: 'd.uploaded_at, d.id',
    entry: 'd.entry_id',
  },
  igc: {
    columns: [['i.id', 'id'], ['i.entry_id', 'entry_id'], ['i.unit_id', 'unit_id'], ['i.pilot', 'pilot'], ['i.copilot', 'copilot'],
      ['i.glider_type', 'glider_type'], ['i.glider_id', 'glider_id'], ['i.declared_comp_id', 'declared_comp_id'],
      ['i.declared_class', 'declared_class'], ['i.has_g_record', 'has_g_record'], ['i.uploaded_at', 'uploaded_at'], ['i.flight_date', 'flight_date'],
      ['i.original_filename', 'original_filename'], ['i.recorder_id', 'recorder_id'], ['i.firmware_version', 'firmware_version'], ['i.extensions', 'extensions']],
    from: 'igc_files i where i.competition_id = :competitionId and not i.superseded',
    order: 'i.uploaded_at, i.id',
    entry: 'i.entry_id',
  },
  // Within a day the engine takes the last weigh-in it is given: in the order of the time of
  // the grid check it came with, so the later check's weighing counts.
  weighIn: {
    columns: [['w.id', 'id'], ['w.entry_id', 'entry_id'], ['w.units', 'units'], ['w.readings', 'readings'], ['w.weighed_on', 'weighed_on'],
      ['w.declared_ballast_kg::text', 'declared_ballast_kg']],
    from: 'weigh_ins w left join grid_checks g on g.id = w.grid_check_id where w.competition_id = :competitionId',
    order: 'w.weighed_on, g.checked_at, w.created_at, w.id',
    entry: 'w.entry_id',
  },
  gridCheck: {
    columns: [['g.entry_id', 'entry_id'], ['g.outcome', 'outcome'], ['g.day', 'day'], ['g.answers', 'answers']],
    from: 'grid_checks g where g.id in (:latestChecks)',
    entry: 'g.entry_id',
  },
  // The field, of every entry whatever the scope: [id, competition ID, status] and [entry id,
  // radio ID]. Slim, and as long as the competition even when one entry is read: each comes in
  // one row, as a list.
  fieldEntry: {
    columns: [['e.id', '0'], ['e.comp_id', '1'], ['e.status', '2']],
    from: 'entries e where e.competition_id = :competitionId',
    list: true,
  },
  fieldRadioId: {
    columns: [['u.entry_id', '0'], ['u.radio_id', '1']],
    from: `units u where u.competition_id = :competitionId and u.kind = 'collision-warning' and u.radio_id is not null`,
    list: true,
  },
} satisfies Record<string, PartSpec>

interface PartSpec {
  columns: readonly Column[]
  from: string
  /** The order the engine reads the part's rows in. */
  order?: string
  /** The entry a row belongs to, for the scope. */
  entry?: string
  /** The part comes as one row holding the list of its rows. */
  list?: boolean
}

type PartName = keyof typeof PARTS

/**
 * A row of the dossier statement: its part, its place in the part's order, its columns — or,
 * for a few entries' dossiers, part 'packed' holding every part as a list, in PARTS' order.
 */
export interface DossierPartRow {
  part: string
  n: string | number
  r: unknown[]
}

/**
 * The statement that reads the dossiers of a competition's entries in `scope` — every entry, or
 * `entryIds`; accepted ones only; with a day's latest grid check — as rows of `DossierPartRow`:
 * one round trip whatever the scope. A few entries' (what a grid check, a director's action or
 * an entry's page waits for) come in one row, each part a short list; the whole competition's
 * as a row per row, since one large value is read several times slower by the driver. The
 * field always covers the whole competition.
 */
function dossierSql(scope: { ids: boolean, acceptedOnly: boolean, day: boolean }): string {
  const names = Object.keys(PARTS) as PartName[]
  const read = (name: PartName) => {
    const part: PartSpec = PARTS[name]
    const filters: string[] = []
    if (part.entry && scope.ids) filters.push(`${part.entry} = any(:ids::uuid[])`)
    // Accepted only: a look-up of each row's entry by its key. (An `in (select …)` over the
    // competition's entries is planned as a loop over them for every row: ten times slower.)
    if (part.entry && scope.acceptedOnly) {
      filters.push(name === 'entry' ? `e.status = 'accepted'` : `exists (select 1 from entries x where x.id = ${part.entry} and x.status = 'accepted')`)
    }
    return {
      part,
      columns: `json_build_array(${part.columns.map(c => c[0]).join(', ')})`,
      where: `${part.from}${filters.map(f => ` and ${f}`).join('')}`,
      wanted: name !== 'gridCheck' || scope.day,
    }
  }
  const list = ({ part, columns, where, wanted }: ReturnType<typeof read>) => (wanted
    ? `(select coalesce(json_agg(${columns}${part.order ? ` order by ${part.order}` : ''}), '[]') from ${where})`
    : `'[]'::json`)
  // A few entries (a grid check's, an entry page's): every part as a list, in one row.
  if (scope.ids) return `select 'packed' as part, 0 as n, json_build_array(${names.map(name => list(read(name))).join(', ')}) as r`
  // The whole competition: a row per row of each part (the field's slim lists in one row each).
  return names.flatMap((name) => {
    const x = read(name)
    if (!x.wanted) return []
    if (x.part.list) return [`select '${name}' as part, 0 as n, json_build_array(${list(x)}) as r`]
    const n = x.part.order ? `row_number() over (order by ${x.part.order})` : '0'
    return [`select '${name}' as part, ${n} as n, ${x.columns} as r from ${x.where}`]
  }).join('\nunion all ')
}

/** The rows of each part, as objects with the keys PARTS names, in the part's order. */
function partsOf(rows: readonly DossierPartRow[]): Record<PartName, Record<string, unknown>[]> {
  const names = Object.keys(PARTS) as PartName[]
  const out = Object.fromEntries(names.map(name => [name, []])) as unknown as Record<PartName, { n: number, row: Record<string, unknown> }[]>
  const add = (name: PartName, n: number, r: unknown[]) => {
    const row: Record<string, unknown> = {}
    PARTS[name].columns.forEach(([, key], i) => { row[key] = r[i] })
    out[name].push({ n, row })
  }
  for (const { part, n, r } of rows) {
    if (part === 'packed') names.forEach((name, i) => (r[i] as unknown[][]).forEach((item, j) => add(name, j, item)))
    else if (part in PARTS) {
      const spec: PartSpec = PARTS[part as PartName]
      if (spec.list) (r[0] as unknown[][]).forEach((item, j) => add(part as PartName, j, item))
      else add(part as PartName, Number(n), r)
    }
  }
  return Object.fromEntries(Object.entries(out).map(([name, list]) => [name, list.sort((a, b) => a.n - b.n).map(x => x.row)])) as Record<PartName, Record<string, unknown>[]>
}

/**
 * The statement that reads the dossiers in `scope` and its named bindings, for a caller that
 * reads them beside other rows in one round trip (the grid check adds rows of parts of its
 * own); `dossiersOf` reads the dossier rows among them.
 */
export function dossierStatement(db: Knex, competitionId: string, scope: DossierScope = {}): { sql: string, bindings: Record<string, unknown> } {
  const bindings: Record<string, unknown> = { competitionId }
  if (scope.entryIds) bindings.ids = [...scope.entryIds]
  if (scope.day) bindings.latestChecks = latestGridCheckIds(db, competitionId, scope.day)
  return { sql: dossierSql({ ids: Boolean(scope.entryIds), acceptedOnly: Boolean(scope.acceptedOnly), day: Boolean(scope.day) }), bindings }
}

/** The dossiers from the rows `dossierStatement` read; undefined when there is no such competition. */
export function dossiersOf(rows: readonly DossierPartRow[]): CompetitionDossiers | undefined {
  const parts = partsOf(rows)
  const competition = parts.competition[0] as (FindingsCompetitionRow & { name: string }) | undefined
  if (!competition) return undefined
  const entries = parts.entry as unknown as FindingsEntryRow[]
  // As the driver reads a timestamptz column: a Date (to the millisecond).
  const igcFiles = (parts.igc as unknown as FindingsIgcRow[]).map(f => ({ ...f, uploaded_at: new Date(f.uploaded_at) }))
  const dossiers = toDossiers(entries, parts.unit as unknown as FindingsUnitRow[], parts.document as unknown as FindingsDocumentRow[],
    igcFiles, parts.weighIn as unknown as FindingsWeighInRow[], parts.gridCheck as unknown as FindingsGridCheckRow[])
  const fieldEntries = parts.fieldEntry.map(x => [x[0], x[1], x[2]] as FindingsFieldEntry)
  const fieldRadioIds = parts.fieldRadioId.map(x => [x[0], x[1]] as FindingsFieldRadioId)
  return {
    competitionRow: competition,
    competition: toEngineCompetition(competition, parts.class as unknown as FindingsClassRow[], parts.firmware as unknown as FindingsFirmwareRow[]),
    dossiers,
    field: toField(fieldEntries, fieldRadioIds),
    rows: entries,
  }
}

/**
 * The dossiers of one competition's entries in `scope` (every entry when it names none), in
 * the order of their competition IDs, with the field of the whole competition. Undefined when
 * there is no such competition.
 */
export async function loadCompetitionDossiers(competitionId: string, scope: DossierScope = {}, db: Knex = useDb()): Promise<CompetitionDossiers | undefined> {
  const { sql, bindings } = dossierStatement(db, competitionId, scope)
  const { rows } = await db.raw(sql, bindings) as { rows: DossierPartRow[] }
  return dossiersOf(rows)
}
