// Memberships: which roles a user holds in which competition.
import type { Knex } from 'knex'
import type { Role } from '#shared/constants/roles'
import type { MembershipSummary } from '#shared/types/api'

export async function rolesInCompetition(userId: string, competitionId: string, db: Knex = useDb()): Promise<Role[]> {
  const rows = await db('memberships').where({ user_id: userId, competition_id: competitionId }).select('role')
  return rows.map(r => r.role as Role)
}

/** Columns of a competition (aliased `c`) that a MembershipSummary shows. */
export function summaryColumns(db: Knex) {
  return [
    'c.id', 'c.slug', 'c.name', 'c.airfield_name',
    db.raw(`to_char(c.first_contest_day, 'YYYY-MM-DD') as first_contest_day`),
    db.raw(`to_char(c.last_contest_day, 'YYYY-MM-DD') as last_contest_day`),
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
    .select(...summaryColumns(db), db.raw('array_agg(m.role order by m.role) as roles'))
  return rows.map(r => toMembershipSummary(r, r.roles as Role[]))
}

export interface MemberListItem {
  userId: string
  name: string
  email: string
  roles: Role[]
  /** One row per role held, with the id an organiser removes it by. */
  memberships: { id: string, role: Role }[]
}

export async function listMembers(competitionId: string, db: Knex = useDb()): Promise<MemberListItem[]> {
  const rows = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.competition_id', competitionId)
    .groupBy('u.id')
    .orderBy('u.name')
    .select('u.id', 'u.name', 'u.email', db.raw('array_agg(m.role order by m.role) as roles'),
      db.raw(`json_agg(json_build_object('id', m.id, 'role', m.role) order by m.role) as memberships`))
  return rows.map(r => ({ userId: r.id, name: r.name, email: r.email, roles: r.roles as Role[], memberships: r.memberships }))
}
