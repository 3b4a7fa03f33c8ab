// The one authorization helper of every route: who is asking, and may they act in this
// competition with one of these roles? The decision itself is shared/utils/access.ts.
import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import type { Role } from '#shared/constants/roles'
import type { CompetitionRow } from '#shared/types/rows'
import { decideAccess } from '#shared/utils/access'
import { MESSAGES } from '#shared/constants/messages'

export interface CompetitionAccess {
  user: User
  roles: Role[]
  competition: CompetitionRow
}

export async function requireRole(
  event: H3Event,
  competitionId: string,
  allowed: readonly Role[] | 'any',
): Promise<CompetitionAccess> {
  const { user, competition, rolesHeld } = await requireUserIn(event, competitionId)
  const decision = decideAccess({ user, competitionExists: Boolean(competition), rolesHeld }, allowed)
  if (!decision.allowed) throw httpError(decision.status, decision.message)
  return { user, roles: decision.roles, competition: competition! }
}

export async function requireAdmin(event: H3Event): Promise<User> {
  const user = await requireUser(event)
  if (!user.isAdmin) throw httpError(403, MESSAGES.adminRequired)
  return user
}
