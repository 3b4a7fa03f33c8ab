// Entries: one glider in one class of one competition. Joining (which makes the caller an
// entrant of the competition), the dossier, field-by-field audited changes, units, and the
// status flow draft → submitted → accepted | rejected, withdrawn at any time by the entrant (or
// by the organiser for the pilot, with a reason).
//
// Who may change an entry: its entrant while it is a draft, submitted or rejected AND
// registration has not closed; the organiser (and site administrators) at any time until it
// is withdrawn. A withdrawn entry is final. Every change is audited in its transaction.
import type { Knex } from 'knex'
import type { User } from '#auth-utils'
import type { EntryStatus } from '#shared/constants/entries'
import { MESSAGES } from '#shared/constants/messages'
import type { EntryBody, EntryPatch, EntryWithdrawBody, OccupantMasses, UnitBody } from '#shared/schemas/entry'
import type { CompetitionClassSummary } from '#shared/types/api'
import type {
  DossierDocument, DossierIgcFile, DossierPayment, EntryCompetitionInfo, EntryDossier, EntryPermissions,
  EntryView, MyEntrySummary, OpenCompetition, UnitView,
} from '#shared/types/api-entries'
import type { EntryRow, UnitRow } from '#shared/types/rows'
import { entryProgress } from '#shared/utils/entry-progress'
import { effectiveRoles } from '#shared/utils/access'
import type { Role } from '#shared/constants/roles'
import { audit } from '#domain/audit/audit'
import { fieldChange } from '#domain/audit/personal-fields'
import { dossierChanged, noteChangeAfterAcceptance } from '#domain/board/dossier-changed'
import { UNIT_FIELDS, writeUnitChange, type UnitField } from '#domain/board/unit-changes'
import { findCompetition, listClasses } from '#domain/competitions/competitions'
import { currentNoticeVersion } from '#domain/competitions/privacy-notice'
import { OPEN_SQL, TODAY_SQL } from '#domain/competitions/registration-sql'
import { settleEntryPayments } from '#domain/fees/fees'
import { countFindings, entryFindings, findingsByEntry } from '#domain/findings/findings'
import { enqueueMail } from '#domain/mail/outbox'
import { entryAcceptedMail, entryRejectedMail, entrySubmittedMail, entryToReviewMail, ruleLink } from '#domain/mail/templates'
import { entryWithdrawnMail, entryWithdrawnOfficeMail } from '#domain/mail/templates-office'
import { rolesInCompetition } from '#domain/people/memberships'
import { iso, num } from '#domain/read-model/values'
import { actionsQuery, type BoardActionRow, toTileAction } from '#domain/read-model/day-inputs'
import type { TileAction } from '#shared/utils/board-tile'
import type { EntryAccess } from '#server/utils/authz'
import { together, useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'
import { reminderOpenItems } from '#shared/utils/reminder-items'
import { rulesOf } from '#shared/utils/rules'
import { formatMoney } from '#shared/utils/money'

// ---------------------------------------------------------------------------------------
// Reading

export function toEntryView(row: EntryRow & { entrant_name?: string }): EntryView {
  return {
    id: row.id,
    competitionId: row.competition_id,
    classId: row.class_id,
    entrantUserId: row.entrant_user_id,
    entrantName: row.entrant_name ?? '',
    status: row.status,
    decisionReason: row.decision_reason,
    pilotName: row.pilot_name,
    pilotNationality: row.pilot_nationality,
    pilotLicenceNumber: row.pilot_licence_number,
    pilotPhone: row.pilot_phone,
    emergencyContact: row.emergency_contact,
    copilotName: row.copilot_name,
    crewNames: row.crew_names ?? [],
    gliderType: row.glider_type,
    registration: row.registration,
    compId: row.comp_id,
    spanM: num(row.span_m),
    mtomKg: num(row.mtom_kg),
    emptyMassKg: num(row.empty_mass_kg),
    cgForwardLimitM: num(row.cg_forward_limit_m),
    cgAftLimitM: num(row.cg_aft_limit_m),
    datumDescription: row.datum_description,
    motorGlider: (row.motor_glider ?? 'none') as EntryView['motorGlider'],
    changedAfterAcceptanceAt: iso(row.changed_after_acceptance_at),
    pilotMassKg: num(row.pilot_mass_kg),
    copilotMassKg: num(row.copilot_mass_kg),
    pilotArmM: num(row.pilot_arm_m),
    copilotArmM: num(row.copilot_arm_m),
    ballastArmM: num(row.ballast_arm_m),
    paymentStatus: row.payment_status,
    submittedAt: iso(row.submitted_at),
    decidedAt: iso(row.decided_at),
    withdrawnAt: iso(row.withdrawn_at),
    updatedAt: row.updated_at.toISOString(),
  }
}

export function toUnitView(row: UnitRow): UnitView {
  return {
    id: row.id,
    entryId: row.entry_id,
    kind: row.kind,
    model: row.model,
    serial: row.serial,
    firmwareVersion: row.firmware_version,
    radioId: row.radio_id,
    firmwareExpiresOn: row.firmware_expires_on,
    firmwareUpdatedOn: row.firmware_updated_on,
    obstacleDbVersion: row.obstacle_db_version,
    obstacleDbExpiresOn: row.obstacle_db_expires_on,
    approvalLevel: row.approval_level as UnitView['approvalLevel'],
    igcRecorderId: row.igc_recorder_id ?? null,
  }
}

const UNIT_COLUMNS = [
  'id', 'entry_id', 'competition_id', 'kind', 'model', 'serial', 'firmware_version', 'radio_id',
  'obstacle_db_version', 'approval_level', 'created_at', 'updated_at',
  'firmware_expires_on', 'firmware_updated_on', 'obstacle_db_expires_on', 'igc_recorder_id',
]

export async function listUnits(entryIds: string[], db: Knex = useDb()): Promise<UnitRow[]> {
  if (!entryIds.length) return []
  return db('units').whereIn('entry_id', entryIds).orderBy([{ column: 'kind' }, { column: 'created_at' }]).select(UNIT_COLUMNS)
}

/** An entry of the competition, or undefined (the access helper reads it before deciding). */
export async function findCompetitionEntry(competitionId: string, entryId: string, db: Knex = useDb()): Promise<EntryRow | undefined> {
  return db<EntryRow>('entries').where({ id: entryId, competition_id: competitionId }).first()
}

async function readEntry(db: Knex, entryId: string): Promise<EntryRow & { entrant_name: string }> {
  return db('entries as e').join('users as u', 'u.id', 'e.entrant_user_id').where('e.id', entryId).first('e.*', 'u.name as entrant_name')
}

interface RegistrationWindow {
  opensOn: string | null
  closesOn: string | null
  /** The last contest day; after it, an accepted entry is the organiser's alone. */
  lastContestDay: string | null
  contestOver: boolean
  /** Today in the competition's own time zone. */
  today: string
  open: boolean
  closed: boolean
}

export async function registrationWindow(competitionId: string, db: Knex = useDb()): Promise<RegistrationWindow> {
  const row = await db('competitions as c').where('c.id', competitionId).first(
    'c.registration_opens_on as opens_on',
    'c.registration_closes_on as closes_on',
    'c.last_contest_day as last_contest_day',
    db.raw(`${TODAY_SQL} as today`),
  )
  const opensOn: string | null = row?.opens_on ?? null
  const closesOn: string | null = row?.closes_on ?? null
  const today: string = row?.today
  const closed = closesOn !== null && today > closesOn
  const lastContestDay: string | null = row?.last_contest_day ?? null
  return { opensOn, closesOn, today, closed, open: !closed && (opensOn === null || today >= opensOn), lastContestDay, contestOver: lastContestDay !== null && today > lastContestDay }
}

// ---------------------------------------------------------------------------------------
// Documents, IGC files and payments (their own modules write them; the dossier reads them).

/** An entry's current documents, current IGC files and payments, for the dossier and its progress. */
export async function dossierExtras(entryIds: string[], db: Knex = useDb()): Promise<Map<string, {
  documents: DossierDocument[]
  igcFiles: DossierIgcFile[]
  payments: DossierPayment[]
}>> {
  const extras = new Map(entryIds.map(id => [id, { documents: [] as DossierDocument[], igcFiles: [] as DossierIgcFile[], payments: [] as DossierPayment[] }]))
  if (!entryIds.length) return extras
  const [documents, igcFiles, payments] = await together(db, [
    db('documents').whereIn('entry_id', entryIds).where('superseded', false).orderBy('uploaded_at').select('id', 'entry_id', 'kind', 'status'),
    db('igc_files').whereIn('entry_id', entryIds).where('superseded', false).orderBy('uploaded_at').select('id', 'entry_id', 'unit_id'),
    db('payments').whereIn('entry_id', entryIds).orderBy('created_at').select('id', 'entry_id', 'status', 'amount_minor'),
  ])
  for (const d of documents) extras.get(d.entry_id)!.documents.push({ id: d.id, kind: d.kind, status: d.status })
  for (const f of igcFiles) extras.get(f.entry_id)!.igcFiles.push({ id: f.id, unitId: f.unit_id })
  for (const p of payments) extras.get(p.entry_id)!.payments.push({ id: p.id, status: p.status, amountMinor: p.amount_minor })
  return extras
}

const NO_EXTRAS = { documents: [] as DossierDocument[], igcFiles: [] as DossierIgcFile[], payments: [] as DossierPayment[] }

// ---------------------------------------------------------------------------------------
// Permissions

const ENTRANT_EDITABLE: EntryStatus[] = ['draft', 'submitted', 'rejected']

function isOrganiser(access: Pick<EntryAccess, 'roles'>) {
  return access.roles.includes('organiser')
}

function formatDay(day: string): string {
  return new Date(`${day}T12:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
}

/** What only the office changes once an entry is accepted (the entrant asks with a message). */
export const OFFICE_FIELDS_AFTER_ACCEPTANCE = ['classId', 'compId', 'registration', 'gliderType'] as const
const OFFICE_FIELD_WORDS: Record<(typeof OFFICE_FIELDS_AFTER_ACCEPTANCE)[number], string> = {
  classId: 'class', compId: 'competition ID', registration: 'registration', gliderType: 'glider type',
}

/**
 * Why the caller may not change this entry now, or null when they may. An accepted entry stays
 * its entrant's to keep current (units, documents, IGC files, contact data: every field but
 * `OFFICE_FIELDS_AFTER_ACCEPTANCE`) until the end of the last contest day; `changing` names
 * the fields a change touches, so a change of an office field is refused by name.
 */
function editRefusal(access: EntryAccess, entry: EntryRow, window: RegistrationWindow, changing: readonly string[] = []): { status: number, message: string } | null {
  if (entry.status === 'withdrawn') return { status: 409, message: MESSAGES.alreadyWithdrawn }
  if (isOrganiser(access)) return null
  if (!access.isOwner) return { status: 403, message: MESSAGES.organiserOrEntrantOnly }
  if (entry.status === 'accepted') {
    if (window.contestOver) return { status: 403, message: MESSAGES.contestOverForEntrant(formatDay(window.lastContestDay!)) }
    const office = OFFICE_FIELDS_AFTER_ACCEPTANCE.filter(f => changing.includes(f))
    if (office.length) return { status: 403, message: MESSAGES.officeOnlyAfterAcceptance(office.map(f => OFFICE_FIELD_WORDS[f]).join(', ')) }
    return null
  }
  if (window.closed) return { status: 403, message: MESSAGES.registrationClosedForEntrant(formatDay(window.closesOn!)) }
  if (!ENTRANT_EDITABLE.includes(entry.status)) return { status: 403, message: MESSAGES.entryLockedForEntrant(entry.status) }
  return null
}

function assertMayEdit(access: EntryAccess, entry: EntryRow, window: RegistrationWindow, changing: readonly string[] = []) {
  const refusal = editRefusal(access, entry, window, changing)
  if (refusal) throw httpError(refusal.status, refusal.message)
}

function permissions(access: EntryAccess, entry: EntryRow, window: RegistrationWindow): EntryPermissions {
  const refusal = editRefusal(access, entry, window)
  let editNote = refusal?.message ?? ''
  if (!refusal) {
    if (isOrganiser(access) && !access.isOwner) editNote = 'As the organiser you can change this entry at any time; every change is recorded in the audit log.'
    else if (entry.status === 'accepted') editNote = `Keep the entry current until the last contest day${window.lastContestDay ? ` (${formatDay(window.lastContestDay)})` : ''}: units, documents, IGC files and contact data. Its class, competition ID, registration and glider type are the office’s to change; every change is recorded and checked again at once.`
    else if (window.closesOn) editNote = `You can change this entry until registration closes on ${formatDay(window.closesOn)}, unless it is accepted; after that only the organiser can.`
    else editNote = 'You can change this entry while it is a draft, submitted or rejected; once accepted only the organiser can.'
  }
  return {
    edit: refusal === null,
    editNote,
    submit: access.isOwner && (entry.status === 'draft' || entry.status === 'rejected') && !window.closed,
    withdraw: access.isOwner && entry.status !== 'withdrawn',
    withdrawForPilot: !access.isOwner && isOrganiser(access) && entry.status !== 'withdrawn',
    decide: isOrganiser(access) && entry.status === 'submitted',
  }
}

// ---------------------------------------------------------------------------------------
// Uniqueness, checked inside the writing transaction under a per-competition lock so two
// concurrent requests cannot both pass.

async function lockCompetitionEntries(trx: Knex, competitionId: string) {
  await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [`gridmark:entries:${competitionId}`])
}

function conflict(field: string, message: string) {
  return httpError(409, message, { field })
}

async function assertCompIdFree(trx: Knex, competitionId: string, compId: string, exceptEntryId?: string) {
  const q = trx('entries')
    .where({ competition_id: competitionId })
    .whereNot('status', 'withdrawn')
    .whereRaw('upper(comp_id) = upper(?)', [compId])
  if (exceptEntryId) q.whereNot('id', exceptEntryId)
  const other = await q.first('pilot_name', 'registration')
  if (other) throw conflict('compId', MESSAGES.compIdTaken(compId.toUpperCase(), other.pilot_name, other.registration))
}

async function assertRadioIdFree(trx: Knex, competitionId: string, radioId: string, entryId: string, exceptUnitId?: string) {
  const q = trx('units as u')
    .join('entries as e', 'e.id', 'u.entry_id')
    .where({ 'u.competition_id': competitionId, 'u.kind': 'collision-warning' })
    .whereNot('e.status', 'withdrawn')
    .whereRaw('upper(u.radio_id) = upper(?)', [radioId])
  if (exceptUnitId) q.whereNot('u.id', exceptUnitId)
  const other = await q.first('e.id', 'e.comp_id', 'e.pilot_name', 'e.registration')
  if (!other) return
  if (other.id === entryId) throw conflict('radioId', MESSAGES.radioIdTakenSameEntry(radioId))
  throw conflict('radioId', MESSAGES.radioIdTaken(radioId, other.comp_id, other.pilot_name, other.registration))
}

async function assertClassInCompetition(trx: Knex, competitionId: string, classId: string) {
  const found = await trx('classes').where({ id: classId, competition_id: competitionId }).first('id')
  if (!found) {
    throw httpError(400, MESSAGES.classNotInCompetition, { fieldErrors: { classId: [MESSAGES.classNotInCompetition] }, formErrors: [] })
  }
}

function assertCgOrder(forward: number | null, aft: number | null) {
  if (forward !== null && aft !== null && !(forward < aft)) {
    throw httpError(400, MESSAGES.cgLimitsOrder, { fieldErrors: { cgAftLimitM: [MESSAGES.cgLimitsOrder] }, formErrors: [] })
  }
}

// ---------------------------------------------------------------------------------------
// Columns ↔ fields

const ENTRY_FIELDS = {
  classId: 'class_id',
  pilotName: 'pilot_name',
  pilotNationality: 'pilot_nationality',
  pilotLicenceNumber: 'pilot_licence_number',
  pilotPhone: 'pilot_phone',
  emergencyContact: 'emergency_contact',
  copilotName: 'copilot_name',
  crewNames: 'crew_names',
  gliderType: 'glider_type',
  registration: 'registration',
  compId: 'comp_id',
  spanM: 'span_m',
  mtomKg: 'mtom_kg',
  emptyMassKg: 'empty_mass_kg',
  cgForwardLimitM: 'cg_forward_limit_m',
  cgAftLimitM: 'cg_aft_limit_m',
  datumDescription: 'datum_description',
  motorGlider: 'motor_glider',
  pilotArmM: 'pilot_arm_m',
  copilotArmM: 'copilot_arm_m',
  ballastArmM: 'ballast_arm_m',
} as const satisfies Record<Exclude<keyof EntryBody, 'privacyNoticeAccepted'>, keyof EntryRow>
type EntryField = keyof typeof ENTRY_FIELDS
const NUMERIC_FIELDS = new Set<EntryField>(['spanM', 'mtomKg', 'emptyMassKg', 'cgForwardLimitM', 'cgAftLimitM', 'pilotArmM', 'copilotArmM', 'ballastArmM'])

function fieldValue(row: EntryRow, field: EntryField): unknown {
  const v = row[ENTRY_FIELDS[field]]
  return NUMERIC_FIELDS.has(field) ? num(v as string | null) : (v ?? null)
}


/** Every column of a unit from its body; fields the kind does not have are null. */
function unitColumnsFromBody(body: UnitBody): Record<string, string | null> {
  const values = body as Partial<Record<UnitField, string | undefined>>
  const out: Record<string, string | null> = {}
  for (const [field, column] of Object.entries(UNIT_FIELDS)) out[column] = values[field as UnitField] ?? null
  return out
}

// ---------------------------------------------------------------------------------------
// Open competitions and joining

export async function listOpenCompetitions(userId: string, db: Knex = useDb()): Promise<OpenCompetition[]> {
  const rows = await db('competitions as c')
    .whereRaw(OPEN_SQL)
    .orderByRaw('c.first_contest_day NULLS LAST, c.name')
    .select(
      'c.id', 'c.name', 'c.airfield_name',
      'c.first_contest_day',
      'c.last_contest_day',
      'c.registration_closes_on as closes_on',
      db.raw(`(select count(*)::int from entries e where e.competition_id = c.id and e.entrant_user_id = ? and e.status <> 'withdrawn') as my_entries`, [userId]),
    )
  // Only competitions with classes can be entered.
  const withClasses = await Promise.all(rows.map(async r => ({ r, classes: await listClasses(r.id, db) })))
  return withClasses.filter(x => x.classes.length > 0).map(({ r, classes }) => ({
    competitionId: r.id,
    name: r.name,
    airfieldName: r.airfield_name,
    firstContestDay: r.first_contest_day,
    lastContestDay: r.last_contest_day,
    registrationClosesOn: r.closes_on,
    classes,
    myEntries: r.my_entries,
  }))
}

/**
 * Joins a competition with an entry in draft. A non-member becomes its entrant in the same
 * transaction; the competition must be open for registration (to non-members a closed or
 * unknown competition does not exist).
 */
export async function createEntry(user: User, competitionId: string, body: EntryBody): Promise<string> {
  const db = useDb()
  const competition = await findCompetition(competitionId)
  const roles = competition ? effectiveRoles(await rolesInCompetition(user.id, competitionId), user.isAdmin) : []
  if (!competition) throw httpError(404, MESSAGES.competitionNotFound)
  const window = await registrationWindow(competitionId)
  if (!window.open) {
    throw httpError(roles.length ? 403 : 404, roles.length ? MESSAGES.registrationNotOpen : MESSAGES.competitionNotFound)
  }

  return db.transaction(async (trx) => {
    await lockCompetitionEntries(trx, competitionId)
    await assertClassInCompetition(trx, competitionId, body.classId)
    await assertCompIdFree(trx, competitionId, body.compId)
    assertCgOrder(body.cgForwardLimitM ?? null, body.cgAftLimitM ?? null)

    const joined = await trx('memberships')
      .insert({ user_id: user.id, competition_id: competitionId, role: 'entrant' })
      .onConflict(['user_id', 'competition_id', 'role']).ignore()
      .returning('id')
    if (joined.length) {
      await audit(trx, { actorUserId: user.id, competitionId, action: 'membership.joined', subjectType: 'membership', subjectId: joined[0].id, details: { role: 'entrant' } })
    }

    const values: Record<string, unknown> = { competition_id: competitionId, entrant_user_id: user.id, status: 'draft' }
    for (const [field, column] of Object.entries(ENTRY_FIELDS)) {
      const v = body[field as EntryField]
      values[column] = v === undefined ? null : v
    }
    values.crew_names = body.crewNames ?? []
    // The body confirmed the notice (the schema refuses it otherwise): record when, and which.
    values.privacy_confirmed_at = trx.fn.now()
    values.privacy_notice_version = await currentNoticeVersion(competitionId, trx)
    const [row] = await trx('entries').insert(values).returning('id')
    await audit(trx, {
      actorUserId: user.id, competitionId, action: 'entry.created', subjectType: 'entry', subjectId: row.id,
      details: { compId: body.compId, registration: body.registration, classId: body.classId },
    })
    await dossierChanged(trx, competitionId, [row.id], user.id)
    return row.id as string
  })
}

// ---------------------------------------------------------------------------------------
// The dossier

/** The open day and the director's actions that count on it for one entry (none while no day is open). */
async function openDayActions(competitionId: string, entryId: string, db: Knex): Promise<{ day: string | null, actions: TileAction[] }> {
  const open = await db('board_days').where({ competition_id: competitionId }).whereNull('closed_at').first('day') as { day: string } | undefined
  if (!open) return { day: null, actions: [] }
  const rows = await actionsQuery(db, competitionId, open.day, [entryId]) as BoardActionRow[]
  return { day: open.day, actions: rows.map(toTileAction) }
}

export async function loadDossier(access: EntryAccess, db: Knex = useDb()): Promise<EntryDossier> {
  const entry = await readEntry(db, access.entry.id)
  const [units, classes, window, extras, findings, onTheDay] = await together(db, [
    () => listUnits([entry.id], db),
    () => listClasses(entry.competition_id, db),
    () => registrationWindow(entry.competition_id, db),
    () => dossierExtras([entry.id], db),
    () => entryFindings(entry.competition_id, entry.id, db),
    () => openDayActions(entry.competition_id, entry.id, db),
  ] as const)
  const { documents, igcFiles, payments } = extras.get(entry.id) ?? NO_EXTRAS
  const rules = rulesOf(access.competition.settings)
  const view = toEntryView(entry)
  const unitViews = units.map(toUnitView)
  const competition: EntryCompetitionInfo = {
    id: access.competition.id,
    name: access.competition.name,
    timeZone: access.competition.time_zone,
    firstContestDay: access.competition.first_contest_day,
    lastContestDay: access.competition.last_contest_day,
    registrationOpensOn: window.opensOn,
    registrationClosesOn: window.closesOn,
    registrationOpen: window.open,
    currency: access.competition.currency,
  }
  const entryClass = classes.find(c => c.id === entry.class_id) as CompetitionClassSummary
  return {
    entry: view,
    competition,
    entryClass,
    classes,
    units: unitViews,
    rules,
    documents,
    igcFiles,
    payments,
    progress: entryProgress({ entry: view, units: unitViews, rules, documents, igcFiles, paymentStatus: entry.payment_status, findings: findings.findings, ...onTheDay }),
    findings: findings.findings,
    can: permissions(access, entry, window),
    roles: access.roles as Role[],
    isOwner: access.isOwner,
  }
}

// ---------------------------------------------------------------------------------------
// Changes

/** Applies a PATCH; one audit row per changed field (old → new). */
export async function updateEntry(access: EntryAccess, patch: EntryPatch): Promise<void> {
  const { competition, user } = access
  await useDb().transaction(async (trx) => {
    await lockCompetitionEntries(trx, competition.id)
    const current: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
    const window = await registrationWindow(competition.id, trx)
    assertMayEdit(access, current, window)

    const changes: Record<string, unknown> = {}
    const changed: { field: EntryField, from: unknown, to: unknown }[] = []
    for (const field of Object.keys(ENTRY_FIELDS) as EntryField[]) {
      const next = (patch as Record<string, unknown>)[field]
      if (next === undefined) continue
      const from = fieldValue(current, field)
      if (JSON.stringify(from) === JSON.stringify(next)) continue
      changes[ENTRY_FIELDS[field]] = next
      changed.push({ field, from, to: next })
    }
    if (!changed.length) return
    assertMayEdit(access, current, window, changed.map(c => c.field))

    if (patch.classId !== undefined) await assertClassInCompetition(trx, competition.id, patch.classId)
    if (changes.comp_id !== undefined) await assertCompIdFree(trx, competition.id, patch.compId!, current.id)
    const forward = patch.cgForwardLimitM !== undefined ? patch.cgForwardLimitM : fieldValue(current, 'cgForwardLimitM') as number | null
    const aft = patch.cgAftLimitM !== undefined ? patch.cgAftLimitM : fieldValue(current, 'cgAftLimitM') as number | null
    assertCgOrder(forward, aft)

    await trx('entries').where({ id: current.id }).update({ ...changes, updated_at: trx.fn.now() })
    // One row per field; a personal field (phone, contact, names…) says only that it changed.
    await audit(trx, changed.map(c => ({
      actorUserId: user.id, competitionId: competition.id, action: 'entry.updated', subjectType: 'entry', subjectId: current.id,
      details: fieldChange(c.field, c.from, c.to),
    })))
    // Another class has another fee: a dearer one leaves the difference owed.
    if (changes.class_id !== undefined) await settleEntryPayments(trx, competition.id, [current.id], user.id)
    await noteChangeAfterAcceptance(trx, [current.id])
    await dossierChanged(trx, competition.id, [current.id], user.id)
  })
}

async function lockedEntryForUnits(trx: Knex, access: EntryAccess): Promise<EntryRow> {
  await lockCompetitionEntries(trx, access.competition.id)
  const current: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
  assertMayEdit(access, current, await registrationWindow(access.competition.id, trx))
  return current
}

export async function addUnit(access: EntryAccess, body: UnitBody): Promise<UnitView> {
  return useDb().transaction(async (trx) => {
    const entry = await lockedEntryForUnits(trx, access)
    if (body.kind === 'collision-warning') await assertRadioIdFree(trx, entry.competition_id, body.radioId, entry.id)
    const [{ id }] = await trx('units')
      .insert({ entry_id: entry.id, competition_id: entry.competition_id, kind: body.kind, ...unitColumnsFromBody(body) })
      .returning('id')
    await trx('entries').where({ id: entry.id }).update({ updated_at: trx.fn.now() })
    await audit(trx, {
      actorUserId: access.user.id, competitionId: entry.competition_id, action: 'unit.added', subjectType: 'unit', subjectId: id,
      details: { entryId: entry.id, ...body },
    })
    await noteChangeAfterAcceptance(trx, [entry.id])
    await dossierChanged(trx, entry.competition_id, [entry.id], access.user.id)
    const [row] = await trx('units').where({ id }).select(UNIT_COLUMNS)
    return toUnitView(row)
  })
}

/** Replaces a unit's fields (the body is the whole unit); one audit row per changed field. */
export async function updateUnit(access: EntryAccess, unitId: string, body: UnitBody): Promise<UnitView> {
  return useDb().transaction(async (trx) => {
    const entry = await lockedEntryForUnits(trx, access)
    const [current]: UnitRow[] = await trx('units').where({ id: unitId, entry_id: entry.id }).select(UNIT_COLUMNS)
    if (!current) throw httpError(404, MESSAGES.unitNotFound)
    if (current.kind !== body.kind) throw httpError(400, MESSAGES.unitKindFixed)
    if (body.kind === 'collision-warning') await assertRadioIdFree(trx, entry.competition_id, body.radioId, entry.id, unitId)

    const changed = await writeUnitChange(trx, {
      competitionId: entry.competition_id, entryId: entry.id, current, next: unitColumnsFromBody(body), actorUserId: access.user.id,
    })
    if (!changed.length) return toUnitView(current)
    await dossierChanged(trx, entry.competition_id, [entry.id], access.user.id)
    const [row] = await trx('units').where({ id: unitId }).select(UNIT_COLUMNS)
    return toUnitView(row)
  })
}

export async function deleteUnit(access: EntryAccess, unitId: string): Promise<void> {
  await useDb().transaction(async (trx) => {
    const entry = await lockedEntryForUnits(trx, access)
    const [current]: UnitRow[] = await trx('units').where({ id: unitId, entry_id: entry.id }).select(UNIT_COLUMNS)
    if (!current) throw httpError(404, MESSAGES.unitNotFound)
    await trx('units').where({ id: unitId }).delete()
    await trx('entries').where({ id: entry.id }).update({ updated_at: trx.fn.now() })
    await audit(trx, {
      actorUserId: access.user.id, competitionId: entry.competition_id, action: 'unit.deleted', subjectType: 'unit', subjectId: unitId,
      details: { ...toUnitView(current) },
    })
    await noteChangeAfterAcceptance(trx, [entry.id])
    await dossierChanged(trx, entry.competition_id, [entry.id], access.user.id)
  })
}

// ---------------------------------------------------------------------------------------
// Status flow

async function organiserEmails(trx: Knex, competitionId: string): Promise<string[]> {
  const rows = await trx('memberships as m').join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.competition_id': competitionId, 'm.role': 'organiser' }).distinct('u.email')
  return rows.map(r => r.email as string)
}

async function entrantEmail(trx: Knex, entry: EntryRow): Promise<{ email: string, name: string }> {
  return trx('users').where({ id: entry.entrant_user_id }).first('email', 'name')
}

/** The entry's page: where its entrant acts on it, and where the organiser decides on it. */
function entryPageUrl(competitionId: string, entryId: string): string {
  return `${siteUrl()}/competitions/${competitionId}/entries/${entryId}`
}

function entryLabel(entry: EntryRow) {
  return `${entry.comp_id} (${entry.glider_type}, ${entry.registration})`
}

export async function submitEntry(access: EntryAccess): Promise<void> {
  const { competition, user } = access
  await useDb().transaction(async (trx) => {
    const entry: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
    if (entry.status !== 'draft' && entry.status !== 'rejected') throw httpError(409, MESSAGES.cannotSubmitStatus(entry.status))
    const window = await registrationWindow(competition.id, trx)
    if (window.closed) throw httpError(403, MESSAGES.registrationClosedForEntrant(formatDay(window.closesOn!)))

    const units = (await listUnits([entry.id], trx)).map(toUnitView)
    const extras = (await dossierExtras([entry.id], trx)).get(entry.id) ?? NO_EXTRAS
    const progress = entryProgress({
      entry: toEntryView(entry), units, rules: rulesOf(competition.settings),
      documents: extras.documents, igcFiles: extras.igcFiles, paymentStatus: entry.payment_status,
    })
    const blocking = progress.missing.filter(m => m.blocksSubmit)
    if (blocking.length) {
      const texts = blocking.map(m => m.text)
      throw httpError(400, MESSAGES.cannotSubmit(texts), { missing: texts, formErrors: texts })
    }

    await trx('entries').where({ id: entry.id }).update({
      status: 'submitted', submitted_at: trx.fn.now(), decision_reason: null, decided_at: null, decided_by: null, updated_at: trx.fn.now(),
    })
    await audit(trx, {
      actorUserId: user.id, competitionId: competition.id, action: 'entry.submitted', subjectType: 'entry', subjectId: entry.id,
      details: { from: entry.status, to: 'submitted' },
    })
    const entrant = await entrantEmail(trx, entry)
    const entryUrl = entryPageUrl(competition.id, entry.id)
    const submitted = entrySubmittedMail({
      entrantName: entrant.name,
      entryLabel: entryLabel(entry),
      compId: entry.comp_id,
      competitionName: competition.name,
      missing: progress.missing.map(m => m.text),
      entryUrl,
    })
    await enqueueMail(trx, {
      to: entrant.email,
      subject: submitted.subject,
      text: submitted.text,
      html: submitted.html,
      template: 'entry-submitted',
      competitionId: competition.id,
      entryId: entry.id,
    })
    const review = entryToReviewMail({ pilotName: entry.pilot_name, entryLabel: entryLabel(entry), compId: entry.comp_id, competitionName: competition.name, entryUrl })
    for (const to of await organiserEmails(trx, competition.id)) {
      await enqueueMail(trx, {
        to,
        subject: review.subject,
        text: review.text,
        html: review.html,
        template: 'entry-submitted',
        competitionId: competition.id,
        entryId: entry.id,
      })
    }
    await dossierChanged(trx, competition.id, [entry.id], user.id)
  })
}

/**
 * Withdraws an entry (final; its competition ID and radio IDs become free and it leaves the
 * board). Its own entrant withdraws it; the organiser may withdraw it for the pilot, with a
 * reason the pilot is told. The entrant gets a confirmation (or the office's reason), each
 * organiser a notice naming the entry and the refund due: the money received for it, net of
 * refunds (`entries.paid_minor`). Audited with who withdrew it and why.
 */
export async function withdrawEntry(access: EntryAccess, body: Partial<EntryWithdrawBody> = {}): Promise<void> {
  const byOffice = !access.isOwner
  if (byOffice && !isOrganiser(access)) throw httpError(403, MESSAGES.withdrawEntrantOrOrganiser)
  if (byOffice && !body.reason) {
    throw httpError(400, MESSAGES.withdrawReasonRequired, { fieldErrors: { reason: [MESSAGES.withdrawReasonRequired] }, formErrors: [] })
  }
  await useDb().transaction(trx => withdrawEntryIn(trx, access, body))
}

/**
 * The withdrawal itself, in the caller's transaction, for a caller that has already decided it
 * may withdraw (`withdrawEntry` for a route; deleting an account withdraws its open entries
 * in the deletion's transaction, as their entrant).
 */
export async function withdrawEntryIn(trx: Knex.Transaction, access: EntryAccess, body: Partial<EntryWithdrawBody> = {}): Promise<void> {
  const { competition, user } = access
  const byOffice = !access.isOwner
  const entry: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
  if (entry.status === 'withdrawn') throw httpError(409, MESSAGES.alreadyWithdrawn)
  await trx('entries').where({ id: entry.id }).update({ status: 'withdrawn', withdrawn_at: trx.fn.now(), updated_at: trx.fn.now() })
  await audit(trx, {
    actorUserId: user.id, competitionId: competition.id, action: 'entry.withdrawn', subjectType: 'entry', subjectId: entry.id,
    details: {
      from: entry.status, to: 'withdrawn', by: byOffice ? 'office' : 'entrant', paidMinor: entry.paid_minor,
      // The office's reason is its decision, kept; the pilot's own words about themselves are
      // personal (personal-fields.ts): the office has them by e-mail, the log only that they came.
      ...(body.reason ? (byOffice ? { reason: body.reason } : { reasonGiven: true }) : {}),
    },
  })

  const entrant = await entrantEmail(trx, entry)
  const paid = entry.paid_minor > 0 ? formatMoney(entry.paid_minor, competition.currency) : null
  const entryUrl = entryPageUrl(competition.id, entry.id)
  const toEntrant = entryWithdrawnMail({
    entrantName: entrant.name,
    entryLabel: entryLabel(entry),
    compId: entry.comp_id,
    competitionName: competition.name,
    byOffice: byOffice ? { name: user.name, reason: body.reason! } : undefined,
    paid,
    entryUrl,
  })
  await enqueueMail(trx, {
    to: entrant.email, subject: toEntrant.subject, text: toEntrant.text, html: toEntrant.html,
    template: 'entry-withdrawn', competitionId: competition.id, entryId: entry.id,
  })
  const toOffice = entryWithdrawnOfficeMail({
    pilotName: entry.pilot_name,
    entryLabel: entryLabel(entry),
    compId: entry.comp_id,
    competitionName: competition.name,
    withdrawnBy: byOffice ? { name: user.name, office: true, reason: body.reason } : { name: entrant.name, office: false, reason: body.reason },
    refundDue: paid,
    // The entry's payments, where the office sees what was paid and refunds it.
    paymentsUrl: paid ? `${entryUrl}/payment` : entryUrl,
  })
  for (const to of await organiserEmails(trx, competition.id)) {
    await enqueueMail(trx, {
      to, subject: toOffice.subject, text: toOffice.text, html: toOffice.html,
      template: 'entry-withdrawn-office', competitionId: competition.id, entryId: entry.id,
    })
  }
  await dossierChanged(trx, competition.id, [entry.id], user.id)
}

export async function decideEntry(access: EntryAccess, decision: { accept: true } | { accept: false, reason: string }): Promise<void> {
  const { competition, user } = access
  await useDb().transaction(async (trx) => {
    const entry: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
    if (entry.status !== 'submitted') throw httpError(409, MESSAGES.cannotDecideStatus(entry.status))
    const status = decision.accept ? 'accepted' : 'rejected'
    const reason = decision.accept ? null : decision.reason
    await trx('entries').where({ id: entry.id }).update({
      status, decision_reason: reason, decided_at: trx.fn.now(), decided_by: user.id, updated_at: trx.fn.now(),
    })
    await audit(trx, {
      actorUserId: user.id, competitionId: competition.id, action: `entry.${status}`, subjectType: 'entry', subjectId: entry.id,
      details: { from: entry.status, to: status, ...(reason ? { reason } : {}) },
    })
    const entrant = await entrantEmail(trx, entry)
    const base = siteUrl()
    const entryUrl = entryPageUrl(competition.id, entry.id)
    const common = { entrantName: entrant.name, entryLabel: entryLabel(entry), compId: entry.comp_id, competitionName: competition.name, entryUrl }
    // Only what is actually open now: the engine's findings on the accepted entry, each with its rule.
    const mail = decision.accept
      ? entryAcceptedMail({
          ...common,
          openItems: reminderOpenItems({ status }, (await entryFindings(competition.id, entry.id, trx)).findings)
            .map(i => ({ text: i.text, link: i.checkId ? ruleLink(base, competition.id, i.checkId) : undefined })),
        })
      : entryRejectedMail({ ...common, reason: reason! })
    await enqueueMail(trx, {
      to: entrant.email,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      template: decision.accept ? 'entry-accepted' : 'entry-rejected',
      competitionId: competition.id,
      entryId: entry.id,
    })
    await dossierChanged(trx, competition.id, [entry.id], user.id)
  })
}

// ---------------------------------------------------------------------------------------
// The entrant's own entries

export async function myEntries(userId: string, db: Knex = useDb()): Promise<MyEntrySummary[]> {
  const rows = await db('entries as e')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .join('classes as k', 'k.id', 'e.class_id')
    .where('e.entrant_user_id', userId)
    .orderByRaw('c.first_contest_day NULLS LAST, c.name, e.created_at')
    .select(
      'e.*', 'c.name as competition_name', 'c.settings as competition_settings', 'k.name as class_name',
      'c.first_contest_day as c_first',
      'c.last_contest_day as c_last',
    )
  const ids = rows.map(r => r.id as string)
  const byCompetition = new Map<string, string[]>()
  for (const r of rows) byCompetition.set(r.competition_id, [...(byCompetition.get(r.competition_id) ?? []), r.id])
  const [units, extras, ...findingMaps] = await Promise.all([
    listUnits(ids, db),
    dossierExtras(ids, db),
    ...[...byCompetition].map(([competitionId, entryIds]) => findingsByEntry(competitionId, entryIds, db)),
  ])
  const findings = new Map(findingMaps.flatMap(m => [...m]))
  return rows.map((r) => {
    const view = toEntryView(r)
    const x = extras.get(r.id) ?? NO_EXTRAS
    const progress = entryProgress({
      entry: view,
      units: units.filter(u => u.entry_id === r.id).map(toUnitView),
      rules: rulesOf(r.competition_settings),
      documents: x.documents,
      igcFiles: x.igcFiles,
      paymentStatus: view.paymentStatus,
      findings: findings.get(r.id) ?? [],
    })
    return {
      id: view.id,
      competitionId: view.competitionId,
      competitionName: r.competition_name,
      firstContestDay: r.c_first,
      lastContestDay: r.c_last,
      className: r.class_name,
      compId: view.compId,
      gliderType: view.gliderType,
      registration: view.registration,
      pilotName: view.pilotName,
      status: view.status,
      paymentStatus: view.paymentStatus,
      missing: progress.missing.map(m => m.text),
      nextStep: progress.nextStep,
      findings: countFindings(findings.get(r.id) ?? []),
    }
  })
}


// ---------------------------------------------------------------------------------------
// The registration weighing

/**
 * Staff record the pilot's and co-pilot's weighed mass with parachute (the registration
 * weighing); whatever the entry's status. One audit row per changed mass (numbers only).
 */
export async function recordOccupantMasses(access: EntryAccess, body: OccupantMasses): Promise<void> {
  const { competition, user } = access
  await useDb().transaction(async (trx) => {
    const current: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
    if (current.status === 'withdrawn') throw httpError(409, MESSAGES.alreadyWithdrawn)
    const changes: Record<string, number | null> = {}
    const changed: { field: string, from: number | null, to: number | null }[] = []
    for (const [field, column] of [['pilotMassKg', 'pilot_mass_kg'], ['copilotMassKg', 'copilot_mass_kg']] as const) {
      const next = body[field]
      if (next === undefined) continue
      const from = num(current[column])
      if (from === next) continue
      changes[column] = next
      changed.push({ field, from, to: next })
    }
    if (!changed.length) return
    await trx('entries').where({ id: current.id }).update({ ...changes, updated_at: trx.fn.now() })
    for (const c of changed) {
      await audit(trx, {
        actorUserId: user.id, competitionId: competition.id, action: 'entry.occupant-mass-recorded', subjectType: 'entry', subjectId: current.id,
        details: c,
      })
    }
    await dossierChanged(trx, competition.id, [current.id], user.id)
  })
}
