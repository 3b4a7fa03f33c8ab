// POST /api/auth/logout — anyone. Revokes the session row (so a copied cookie stops
// working too) and clears the cookie. Always 200, signed in or not.
import { endSession } from '#domain/people/sessions'

export default defineApiHandler(async (event) => {
  await endSession(event)
  return { ok: true }
})
