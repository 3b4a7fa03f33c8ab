import type { Role } from '#shared/constants/roles'
import type { MeResponse } from '#shared/types/api'
import type { PageAuth } from '~/utils/pageAccess'

// Page access contract (definePageMeta):
//   auth: 'user' (default) — signed in, else /sign-in?next=<this page>
//   auth: 'guest'          — only signed out (sign-in, sign-up); signed-in users go to ?next or home
//   auth: 'public'         — anyone
//   roles: Role[]          — also needs one of these roles in route.params.competitionId
//                            (site administrators count as organisers, as on the server);
//                            otherwise the 403 page (404 if they are not part of it at all).
// This only shapes navigation; every API route checks access again on the server.
declare module '#app' {
  interface PageMeta {
    auth?: PageAuth
    roles?: Role[]
  }
}

/** The session kept on this phone, when the guard may go on with it; loaded only then, so no page carries it. */
async function keptSessionOffline(path: string, status: number | undefined): Promise<MeResponse | null> {
  if (!import.meta.client) return null
  const { keptSessionFor } = await import('~/utils/keptSession')
  return keptSessionFor(path, status)
}

export default defineNuxtRouteMiddleware(async (to) => {
  const session = useSessionStore()
  try {
    await session.load({ path: to.path })
  }
  catch (error) {
    // No answer at all: a launch-grid page may go on offline with the session kept on this
    // phone when the day's pack is here too (utils/keptSession.ts); anything else cannot.
    const kept = await keptSessionOffline(to.path, apiStatus(error))
    if (!kept) {
      return abortNavigation(createError({
        status: 503,
        statusText: 'Service Unavailable',
        message: 'Gridmark cannot reach its server right now. Please try again in a moment.',
        fatal: true,
      }))
    }
    session.useKept(kept)
  }

  const decision = decidePageAccess({
    matched: to.matched.length > 0,
    fullPath: to.fullPath,
    query: to.query,
    params: to.params,
    auth: to.meta.auth,
    roles: to.meta.roles,
  }, { user: session.user, rolesIn: session.rolesIn })

  if (decision.kind === 'redirect') return navigateTo(decision.to, { replace: true })
  if (decision.kind === 'deny') {
    return abortNavigation(createError({ status: decision.status, message: decision.message, fatal: true }))
  }
})
