// Who may do what in a competition: the one decision every API route and page guard uses.
// Pure, so it is unit-tested on its own and runs the same on server and client.
import type { Role } from '../constants/roles'
import { ROLE_LABELS } from '../constants/roles'
import { ACCESS_MESSAGES } from '../constants/messages-access'

export type AccessDecision =
  | { allowed: true, roles: Role[] }
  | { allowed: false, status: 401 | 403 | 404, message: string }

export interface AccessInput {
  user: { isAdmin: boolean } | null
  competitionExists: boolean
  /** Roles the user holds in this competition. */
  rolesHeld: readonly Role[]
}

/**
 * Site administrators act with organiser rights in every competition, but they record grid
 * checks or direct only where they hold those roles themselves.
 * A user with no role in a competition is told it does not exist (404), so ids of other
 * competitions reveal nothing; a member lacking the role gets 403 naming the role needed.
 */
export function decideAccess(input: AccessInput, allowed: readonly Role[] | 'any'): AccessDecision {
  if (!input.user) return { allowed: false, status: 401, message: ACCESS_MESSAGES.notSignedIn }
  if (!input.competitionExists) return { allowed: false, status: 404, message: ACCESS_MESSAGES.competitionNotFound }

  const roles = effectiveRoles(input.rolesHeld, input.user.isAdmin)
  if (roles.length === 0) return { allowed: false, status: 404, message: ACCESS_MESSAGES.competitionNotFound }
  if (allowed === 'any' || roles.some(r => allowed.includes(r))) return { allowed: true, roles }

  const names = allowed.map(r => ROLE_LABELS[r].toLowerCase()).join(' or ')
  return { allowed: false, status: 403, message: ACCESS_MESSAGES.roleRequired(names) }
}

export function effectiveRoles(rolesHeld: readonly Role[], isAdmin: boolean): Role[] {
  const roles = new Set(rolesHeld)
  if (isAdmin) roles.add('organiser')
  return [...roles].sort((a, b) => ROLE_ORDER.indexOf(a) - ROLE_ORDER.indexOf(b))
}

const ROLE_ORDER: Role[] = ['organiser', 'director', 'scrutineer', 'entrant']
