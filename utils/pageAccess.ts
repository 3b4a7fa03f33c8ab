import type { Role } from '#shared/constants/roles'
import { ACCESS_MESSAGES } from '#shared/constants/messages-access'
import { decideAccess } from '#shared/utils/access'

export type PageAuth = 'user' | 'guest' | 'public'

export interface PageAccessTarget {
  matched: boolean
  fullPath: string
  query: Record<string, unknown>
  params: Record<string, unknown>
  auth?: PageAuth
  roles?: Role[]
}

export interface PageViewer {
  user: { isAdmin: boolean } | null
  rolesIn: (competitionId: string) => Role[]
}

export type PageAccessDecision =
  | { kind: 'allow' }
  | { kind: 'redirect', to: string | { path: string, query: Record<string, string> } }
  | { kind: 'deny', status: number, message: string }

/**
 * The page meta contract (see middleware/auth.global.ts) as a pure decision. Role checks go
 * through the same shared rule as the API, so a page never opens where its data would not.
 */
export function decidePageAccess(target: PageAccessTarget, viewer: PageViewer): PageAccessDecision {
  // An address no page serves gets its 404, not a detour through sign-in.
  if (!target.matched) return { kind: 'allow' }

  const auth = target.auth ?? 'user'
  if (auth === 'public') return { kind: 'allow' }
  if (auth === 'guest') {
    return viewer.user ? { kind: 'redirect', to: safeNextPath(target.query.next) } : { kind: 'allow' }
  }
  if (!viewer.user) return { kind: 'redirect', to: { path: '/sign-in', query: { next: target.fullPath } } }

  const roles = target.roles ?? []
  if (roles.length === 0) return { kind: 'allow' }
  const competitionId = typeof target.params.competitionId === 'string' ? target.params.competitionId : ''
  if (!competitionId) return { kind: 'deny', status: 404, message: ACCESS_MESSAGES.competitionNotFound }

  const decision = decideAccess({ user: viewer.user, competitionExists: true, rolesHeld: viewer.rolesIn(competitionId) }, roles)
  return decision.allowed ? { kind: 'allow' } : { kind: 'deny', status: decision.status, message: decision.message }
}
