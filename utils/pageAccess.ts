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

/** The pages a phone can open from the day's pack with no signal: the launch grid, a grid check, a tag link. */
export type OfflinePage = { kind: 'grid', competitionId: string } | { kind: 'tag' }

export function offlinePageOf(path: string): OfflinePage | null {
  const grid = /^\/competitions\/([^/]+)\/grid(?:\/[^/]+)?\/?$/.exec(path)
  if (grid) {
    try {
      return { kind: 'grid', competitionId: decodeURIComponent(grid[1]!) }
    }
    catch {
      return null
    }
  }
  return /^\/t\/[^/]+\/?$/.test(path) ? { kind: 'tag' } : null
}

/** A session seen online is trusted offline no longer than the sign-in cookie lives (nuxt.config.ts, session.maxAge). */
export const KEPT_SESSION_MAX_AGE_MS = 14 * 24 * 60 * 60 * 1000

export interface OfflineSessionInput {
  page: OfflinePage | null
  /** The status /api/me answered with; undefined when no answer came at all (no network). */
  status: number | undefined
  /** When the session kept on this phone was last confirmed by the server; null if none is kept. */
  keptSeenAt: string | null
  /** A pack of the page's competition is kept on this phone (for a grid page). */
  packKept: boolean
  now: Date
}

/**
 * With no answer from the server, may the page guard go on with the session kept on this phone?
 * Only for the pages that work from the day's pack, only when no answer came (a server that
 * answers with an error is not "offline"), only with a session the server confirmed recently,
 * and for a grid page only when that competition's pack is on the phone. A tag link needs no
 * particular pack: its page says plainly when no kept pack knows the tag. The server checks
 * everything again when the checks are sent.
 */
export function mayUseKeptSession(input: OfflineSessionInput): boolean {
  if (input.status !== undefined || !input.page || !input.keptSeenAt) return false
  const age = input.now.getTime() - Date.parse(input.keptSeenAt)
  if (!(age >= 0 && age <= KEPT_SESSION_MAX_AGE_MS)) return false
  return input.page.kind === 'tag' || input.packKept
}
