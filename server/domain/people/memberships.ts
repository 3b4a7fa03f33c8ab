// Memberships: which roles a user holds in which competition.
import type { Knex } from 'knex'
import type { Role } from '#shared/constants/roles'
import { useDb } from '#server/utils/db'

export async function rolesInCompetition(userId: string, competitionId: string, db: Knex = useDb()): Promise<Role[]> {
  const rows = await db('memberships').where({ user_id: userId, competition_id: competitionId }).select('role')
  return rows.map(r => r.role as Role)
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
