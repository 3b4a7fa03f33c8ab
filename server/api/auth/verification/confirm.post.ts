// POST /api/auth/verification/confirm {token} — anyone holding a confirmation link. 200 {user}:
// the address is confirmed (or a new address takes the old one's place) and its owner is signed
// in; 400 for an unknown, used or expired link.
import { verificationConfirmSchema } from '#shared/schemas/account'
import { MESSAGES } from '#shared/constants/messages'
import { confirmEmail } from '#domain/people/account-links'
import { startSession } from '#domain/people/sessions'
import { toPublicUser } from '#domain/people/users'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, verificationConfirmSchema)
  const user = await confirmEmail(body.token)
  await startSession(event, user)
  return { user: toPublicUser(user), message: MESSAGES.emailConfirmed }
})
