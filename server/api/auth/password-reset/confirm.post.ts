// POST /api/auth/password-reset/confirm {token,password} — anyone holding a reset link. 200
// {message}: the password is set, the link spent, every session of the account ended; 400 for a
// weak password or an unknown, used or expired link. Nobody is signed in: the person signs in next.
import { passwordResetConfirmSchema } from '#shared/schemas/account'
import { MESSAGES } from '#shared/constants/messages'
import { resetPassword } from '#domain/people/account-links'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, passwordResetConfirmSchema)
  const user = await resetPassword(body.token, await hashPassword(body.password))
  return { message: MESSAGES.resetDone, email: user.email }
})
