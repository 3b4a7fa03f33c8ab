import type { Role } from '#shared/constants/roles'
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

export default defineNuxtRouteMiddleware(async (to) => {
  const session = useSessionStore()
  try {
    await session.load()
  }
  catch {
    return abortNavigation(createError({
      status: 503,
      statusText: 'Service Unavailable',
      message: 'Gridmark cannot reach its server right now. Please try again in a moment.',
      fatal: true,
    }))
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
