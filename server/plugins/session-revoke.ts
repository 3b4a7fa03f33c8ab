// nuxt-auth-utils' own DELETE /api/_auth/session clears only the cookie; revoke the row too.
import { revokeSession } from '#domain/people/sessions'

export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    if (session.sessionId) await revokeSession(session.sessionId)
  })
})
