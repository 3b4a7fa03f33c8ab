// POST /api/auth/password-reset {email} — anyone. 202 {message} alike whether or not the address
// has an account (only one that has gets the link, valid one hour); 400 bad body; 429 when this
// address has asked too often.
import { passwordResetRequestSchema } from '#shared/schemas/account'
import { MESSAGES } from '#shared/constants/messages'
import { throttleByAddress } from '#domain/people/login-limit'
import { requestPasswordReset } from '#domain/people/account-links'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, passwordResetRequestSchema)
  await throttleByAddress(event, 'passwordResetLimit')
  await requestPasswordReset(body.email, siteUrl(event))
  setResponseStatus(event, 202)
  return { message: MESSAGES.resetCheckMail }
})
