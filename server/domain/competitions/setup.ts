// Competition set-up: creating a competition (site administrators), the organiser's set-up
// fields, its practice and contest days, rule settings and classes. Every change is audited
// with what it was and what it became, in the transaction of the change.
import type { Knex } from 'knex'
import type { z } from 'zod'
import {
  type competitionCreateSchema,
  competitionSetupSchema,
  DEFAULT_RULES,
  type ClassCreateInput,
  type ClassPatchInput,
  type CompetitionSetup,
  type CompetitionSetupPatch,
} from '#shared/schemas/competition'
import { faiClass } from '#shared/constants/classes'
import { MESSAGES } from '#shared/constants/messages'
import type { ClassRow, CompetitionDayRow } from '#shared/types/rows'
import type { CompetitionSetupResponse, SetupClass } from '#shared/types/setup'
import { audit } from '#domain/audit/audit'
import { dossierChanged } from '#domain/board/dossier-changed'
import { settleEntryPayments } from '#domain/fees/fees'
import { useDb } from '#server/utils/db'
import { fieldError, httpError } from '#server/utils/errors'
import { rulesOf } from '#shared/utils/rules'
import { reminderScheduleOf } from '#shared/utils/reminder-schedule'
import { privacyContactOf } from '#shared/utils/privacy-notice'
import { toClassSummary } from './competitions'

function slugFor(name: string): string {
  const base = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'competition'
  return `${base}-${Math.random().toString(36).slice(2, 7)}`
}

export async function createCompetitionWithOrganiser(
  input: z.output<typeof competitionCreateSchema>,
  actorUserId: string,
): Promise<{ id: string, slug: string }> {
  return useDb().transaction(async (trx) => {
    const organiser = await trx('users').whereRaw('lower(email) = ?', [input.organiserEmail]).first('id', 'email')
    if (!organiser) throw fieldError('organiserEmail', MESSAGES.organiserUnknown)
    const [row] = await trx('competitions')
      .insert({
        slug: slugFor(input.name),
        name: input.name,
        airfield_name: input.airfieldName,
        airfield_icao: input.airfieldIcao ?? null,
        time_zone: input.timeZone,
        currency: input.currency,
        first_contest_day: input.firstContestDay,
        last_contest_day: input.lastContestDay,
        settings: DEFAULT_RULES,
        created_by: actorUserId,
      })
      .returning(['id', 'slug'])
    await trx('memberships').insert({ user_id: organiser.id, competition_id: row.id, role: 'organiser', granted_by: actorUserId })
    await audit(trx, {
      actorUserId,
      competitionId: row.id,
      action: 'competition.created',
      subjectType: 'competition',
      subjectId: row.id,
      details: { name: input.name, organiserUserId: organiser.id },
    })
    return { id: row.id as string, slug: row.slug as string }
  })
}

async function readDays(competitionId: string, db: Knex) {
  const days: CompetitionDayRow[] = await db('competition_days')
    .where({ competition_id: competitionId })
    .orderBy('day')
    .select('competition_id', 'kind', 'day')
  return {
    practiceDays: days.filter(d => d.kind === 'practice').map(d => d.day),
    contestDays: days.filter(d => d.kind === 'contest').map(d => d.day),
  }
}

export async function listSetupClasses(competitionId: string, db: Knex = useDb()): Promise<SetupClass[]> {
  const rows: (ClassRow & { entry_count: string })[] = await db('classes as c')
    .where('c.competition_id', competitionId)
    .select('c.*', db.raw('(SELECT count(*) FROM entries e WHERE e.class_id = c.id) as entry_count'))
    .orderBy([{ column: 'c.sort_order' }, { column: 'c.name' }])
  return rows.map(toSetupClass)
}

function toSetupClass(c: ClassRow & { entry_count?: string | number }): SetupClass {
  return {
    ...toClassSummary(c),
    entryFeeMinor: c.entry_fee_minor,
    sortOrder: c.sort_order,
    entryCount: Number(c.entry_count ?? 0),
  }
}

export async function competitionSetup(competitionId: string, db: Knex = useDb()): Promise<CompetitionSetupResponse> {
  const row = await db('competitions')
    .where({ id: competitionId })
    .first(
      'id', 'slug', 'name', 'airfield_name', 'airfield_icao', 'time_zone', 'currency', 'settings', 'late_fee_minor',
      'first_contest_day', 'last_contest_day', 'registration_opens_on', 'registration_closes_on', 'late_fee_after',
    )
  if (!row) throw httpError(404, MESSAGES.competitionNotFound)
  const [days, classes] = await Promise.all([readDays(competitionId, db), listSetupClasses(competitionId, db)])
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    airfieldName: row.airfield_name,
    airfieldIcao: row.airfield_icao,
    timeZone: row.time_zone,
    currency: row.currency,
    firstContestDay: row.first_contest_day,
    lastContestDay: row.last_contest_day,
    ...days,
    registrationOpensOn: row.registration_opens_on,
    registrationClosesOn: row.registration_closes_on,
    lateFeeAfter: row.late_fee_after,
    lateFeeMinor: row.late_fee_minor,
    reminderDays: reminderScheduleOf(row.settings),
    privacyContactEmail: privacyContactOf(row.settings),
    rules: rulesOf(row.settings),
    classes,
  }
}

type SetupValues = Omit<CompetitionSetup, 'firstContestDay' | 'lastContestDay'> & {
  firstContestDay: string | null
  lastContestDay: string | null
}

function setupValuesOf(s: CompetitionSetupResponse): SetupValues {
  return {
    name: s.name,
    airfieldName: s.airfieldName,
    airfieldIcao: s.airfieldIcao,
    timeZone: s.timeZone,
    currency: s.currency,
    firstContestDay: s.firstContestDay,
    lastContestDay: s.lastContestDay,
    practiceDays: s.practiceDays,
    contestDays: s.contestDays,
    registrationOpensOn: s.registrationOpensOn,
    registrationClosesOn: s.registrationClosesOn,
    lateFeeAfter: s.lateFeeAfter,
    lateFeeMinor: s.lateFeeMinor,
    reminderDays: s.reminderDays,
    privacyContactEmail: s.privacyContactEmail,
    rules: s.rules,
  }
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b)

/**
 * Applies a PATCH: merges it into what is stored, checks the whole against the shared schema
 * (so a change of the first contest day cannot strand the contest days outside it), writes
 * only what changed and audits each changed field as { from, to }.
 */
export async function updateCompetitionSetup(competitionId: string, patch: CompetitionSetupPatch, actorUserId: string) {
  return useDb().transaction(async (trx) => {
    await trx('competitions').where({ id: competitionId }).forUpdate().first('id')
    const current = setupValuesOf(await competitionSetup(competitionId, trx))
    const defined = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined))
    const merged = competitionSetupSchema.parse({ ...current, ...defined, rules: { ...current.rules, ...(patch.rules ?? {}) } })

    const changes: Record<string, { from: unknown, to: unknown }> = {}
    for (const key of Object.keys(merged) as (keyof CompetitionSetup)[]) {
      const before = current[key] ?? null
      const after = merged[key] ?? null
      if (!same(before, after)) changes[key] = { from: before, to: after }
    }
    if (Object.keys(changes).length === 0) return competitionSetup(competitionId, trx)

    await trx('competitions').where({ id: competitionId }).update({
      name: merged.name,
      airfield_name: merged.airfieldName,
      airfield_icao: merged.airfieldIcao ?? null,
      time_zone: merged.timeZone,
      currency: merged.currency,
      first_contest_day: merged.firstContestDay,
      last_contest_day: merged.lastContestDay,
      registration_opens_on: merged.registrationOpensOn ?? null,
      registration_closes_on: merged.registrationClosesOn ?? null,
      late_fee_after: merged.lateFeeAfter ?? null,
      late_fee_minor: merged.lateFeeMinor,
      // The reminder schedule and the privacy contact live beside the rules in settings (no check reads them).
      settings: { ...merged.rules, reminderDays: merged.reminderDays, privacyContactEmail: merged.privacyContactEmail ?? null },
      updated_at: trx.fn.now(),
    })
    if (changes.practiceDays || changes.contestDays) {
      await trx('competition_days').where({ competition_id: competitionId }).delete()
      const days = [
        ...merged.practiceDays.map(day => ({ competition_id: competitionId, day, kind: 'practice' })),
        ...merged.contestDays.map(day => ({ competition_id: competitionId, day, kind: 'contest' })),
      ]
      if (days.length) await trx('competition_days').insert(days)
    }
    await audit(trx, {
      actorUserId,
      competitionId,
      action: 'competition.setup-changed',
      subjectType: 'competition',
      subjectId: competitionId,
      details: { changes },
    })
    // The late fee changes what entries owe; the rules and the contest days are read by every check.
    if (changes.lateFeeMinor || changes.lateFeeAfter || changes.timeZone) await settleEntryPayments(trx, competitionId, 'all', actorUserId)
    await dossierChanged(trx, competitionId, 'all', actorUserId)
    return competitionSetup(competitionId, trx)
  })
}

// ——— Classes ———————————————————————————————————————————————————————————————————————

function classColumns(v: ClassPatchInput) {
  const cols: Record<string, unknown> = {}
  if (v.name !== undefined) cols.name = v.name
  if (v.maxSpanM !== undefined) cols.max_span_m = v.maxSpanM
  if (v.maxMtomKg !== undefined) cols.max_mtom_kg = v.maxMtomKg
  if (v.waterBallast !== undefined) cols.water_ballast = v.waterBallast
  if (v.entryFeeMinor !== undefined) cols.entry_fee_minor = v.entryFeeMinor
  if (v.sortOrder !== undefined) cols.sort_order = v.sortOrder
  return cols
}

async function nameTaken(trx: Knex, competitionId: string, name: string, exceptId?: string) {
  const q = trx('classes').where({ competition_id: competitionId }).whereRaw('lower(name) = lower(?)', [name])
  if (exceptId) q.whereNot({ id: exceptId })
  return Boolean(await q.first('id'))
}

/** Adds a class: an FAI class with its defaults (each may be overridden), or a custom one. */
export async function createCompetitionClass(competitionId: string, input: ClassCreateInput, actorUserId: string): Promise<SetupClass> {
  const fai = input.code === 'custom' ? undefined : faiClass(input.code)
  if (input.code !== 'custom' && !fai) throw fieldError('code', MESSAGES.classCodeUnknown)
  const name = input.name ?? fai?.name
  if (!name) throw fieldError('name', MESSAGES.classNameNeeded)
  return useDb().transaction(async (trx) => {
    if (await nameTaken(trx, competitionId, name)) throw fieldError('name', MESSAGES.classNameTaken)
    const { max } = await trx('classes').where({ competition_id: competitionId }).max('sort_order as max').first() as { max: number | null }
    const values = {
      competition_id: competitionId,
      code: input.code,
      name,
      max_span_m: input.maxSpanM !== undefined ? input.maxSpanM : (fai?.maxSpanM ?? null),
      max_mtom_kg: input.maxMtomKg !== undefined ? input.maxMtomKg : (fai?.maxMtomKg ?? null),
      water_ballast: input.waterBallast ?? fai?.waterBallast ?? false,
      entry_fee_minor: input.entryFeeMinor ?? 0,
      sort_order: input.sortOrder ?? (max === null ? 0 : max + 1),
    }
    const [row] = await trx('classes').insert(values).returning('*')
    await audit(trx, {
      actorUserId,
      competitionId,
      action: 'class.created',
      subjectType: 'class',
      subjectId: row.id,
      details: { from: null, to: toSetupClass(row) },
    })
    return toSetupClass(row)
  })
}

export async function updateCompetitionClass(competitionId: string, classId: string, patch: ClassPatchInput, actorUserId: string): Promise<SetupClass> {
  return useDb().transaction(async (trx) => {
    const before: ClassRow | undefined = await trx('classes').where({ id: classId, competition_id: competitionId }).forUpdate().first()
    if (!before) throw httpError(404, MESSAGES.classNotFound)
    if (patch.name !== undefined && await nameTaken(trx, competitionId, patch.name, classId)) throw fieldError('name', MESSAGES.classNameTaken)
    const cols = classColumns(patch)
    if (Object.keys(cols).length === 0) return toSetupClass(before)
    const [after] = await trx('classes').where({ id: classId }).update(cols).returning('*')
    const from = toSetupClass(before)
    const to = toSetupClass(after)
    const changes = Object.fromEntries((Object.keys(to) as (keyof SetupClass)[])
      .filter(k => !same(from[k], to[k]))
      .map(k => [k, { from: from[k], to: to[k] }]))
    if (Object.keys(changes).length) {
      await audit(trx, { actorUserId, competitionId, action: 'class.changed', subjectType: 'class', subjectId: classId, details: { changes } })
      // Its limits are read by the checks of its entries, its place orders them on the board.
      const entries = await trx('entries').where({ class_id: classId }).pluck('id') as string[]
      // A new fee changes what each of its entries owes.
      if (changes.entryFeeMinor) await settleEntryPayments(trx, competitionId, entries, actorUserId)
      await dossierChanged(trx, competitionId, entries, actorUserId)
    }
    const { count } = await trx('entries').where({ class_id: classId }).count('* as count').first() as { count: string }
    return { ...to, entryCount: Number(count) }
  })
}

/** Deletes a class no entry uses; with entries it answers 409 and changes nothing. */
export async function deleteCompetitionClass(competitionId: string, classId: string, actorUserId: string): Promise<void> {
  await useDb().transaction(async (trx) => {
    const before: ClassRow | undefined = await trx('classes').where({ id: classId, competition_id: competitionId }).forUpdate().first()
    if (!before) throw httpError(404, MESSAGES.classNotFound)
    const { count } = await trx('entries').where({ class_id: classId }).count('* as count').first() as { count: string }
    if (Number(count) > 0) throw httpError(409, MESSAGES.classInUse(Number(count)))
    await trx('classes').where({ id: classId }).delete()
    await audit(trx, {
      actorUserId,
      competitionId,
      action: 'class.deleted',
      subjectType: 'class',
      subjectId: classId,
      details: { from: toSetupClass(before), to: null },
    })
  })
}
