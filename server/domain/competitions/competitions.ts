// Competitions and their classes.
import type { Knex } from 'knex'
import type { Role } from '#shared/constants/roles'
import type { CompetitionClassSummary, CompetitionDetail, MembershipSummary } from '#shared/types/api'
import { effectiveRoles } from '#shared/utils/access'
import type { ClassRow, CompetitionRow } from '#shared/types/rows'
import { useDb } from '#server/utils/db'
import { num } from '#domain/read-model/values'

const COMPETITION_COLUMNS = [
  'id', 'slug', 'name', 'airfield_name', 'airfield_icao', 'time_zone', 'currency', 'settings',
  'created_by', 'created_at', 'updated_at', 'first_contest_day', 'last_contest_day',
]

export async function findCompetition(id: string, db: Knex = useDb()): Promise<CompetitionRow | undefined> {
  return db('competitions as c').where('c.id', id).first(...competitionColumns())
}

/**
 * The columns of a CompetitionRow from `competitions as c`; with a prefix, each named
 * `<prefix><column>` so they can sit beside another table's (read back by `prefixedCompetition`).
 */
export function competitionColumns(prefix = ''): string[] {
  return COMPETITION_COLUMNS.map(c => `c.${c} as ${prefix}${c}`)
}

/** The competition in a row read with `competitionColumns(db, prefix)`; undefined when none joined. */
export function prefixedCompetition(row: object, prefix: string): CompetitionRow | undefined {
  const columns = row as Record<string, unknown>
  if (columns[`${prefix}id`] == null) return undefined
  const out: Record<string, unknown> = {}
  for (const c of COMPETITION_COLUMNS) out[c] = columns[`${prefix}${c}`]
  return out as unknown as CompetitionRow
}

/** A class as entrants and screens see it (the set-up adds its fee and order). */
export function toClassSummary(c: ClassRow): CompetitionClassSummary {
  return {
    id: c.id,
    name: c.name,
    code: c.code,
    maxSpanM: num(c.max_span_m),
    maxMtomKg: num(c.max_mtom_kg),
    waterBallast: c.water_ballast,
  }
}

export async function listClasses(competitionId: string, db: Knex = useDb()): Promise<CompetitionClassSummary[]> {
  const rows: ClassRow[] = await db('classes').where({ competition_id: competitionId }).orderBy(['sort_order', 'name'])
  return rows.map(toClassSummary)
}

export async function competitionDetail(row: CompetitionRow, roles: Role[], db: Knex = useDb()): Promise<CompetitionDetail> {
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    airfieldName: row.airfield_name,
    airfieldIcao: row.airfield_icao,
    timeZone: row.time_zone,
    firstContestDay: row.first_contest_day,
    lastContestDay: row.last_contest_day,
    classes: await listClasses(row.id, db),
    roles,
  }
}

/**
 * Every competition, for site administrators, with the roles they act with in each: those
 * they hold, plus organiser rights everywhere.
 */
export async function competitionSummariesForAdmin(userId: string, db: Knex = useDb()): Promise<MembershipSummary[]> {
  const rows = await db('competitions as c')
    .leftJoin('memberships as m', function () {
      this.on('m.competition_id', 'c.id').andOn('m.user_id', db.raw('?', [userId]))
    })
    .groupBy('c.id')
    .orderByRaw('c.first_contest_day NULLS LAST, c.name')
    .select(...summaryColumns(), db.raw('array_remove(array_agg(m.role), NULL) as roles'))
  return rows.map(r => toMembershipSummary(r, effectiveRoles(r.roles as Role[], true)))
}

// ---------------------------------------------------------------------------------------
// A person's competitions with their roles

/** Columns of a competition (aliased `c`) that a MembershipSummary shows. */
export function summaryColumns(): string[] {
  return [
    'c.id', 'c.slug', 'c.name', 'c.airfield_name',
    'c.first_contest_day',
    'c.last_contest_day',
  ]
}

interface SummaryRow {
  id: string
  slug: string
  name: string
  airfield_name: string
  first_contest_day: string | null
  last_contest_day: string | null
}

export function toMembershipSummary(r: SummaryRow, roles: Role[]): MembershipSummary {
  return {
    competitionId: r.id,
    slug: r.slug,
    name: r.name,
    airfieldName: r.airfield_name,
    firstContestDay: r.first_contest_day,
    lastContestDay: r.last_contest_day,
    roles,
  }
}

/** The user's competitions with their roles in each, soonest contest first. */
export async function membershipSummaries(userId: string, db: Knex = useDb()): Promise<MembershipSummary[]> {
  const rows = await db('memberships as m')
    .join('competitions as c', 'c.id', 'm.competition_id')
    .where('m.user_id', userId)
    .groupBy('c.id')
    .orderByRaw('c.first_contest_day NULLS LAST, c.name')
    .select(...summaryColumns(), db.raw('array_agg(m.role order by m.role) as roles'))
  return rows.map(r => toMembershipSummary(r, r.roles as Role[]))
}
