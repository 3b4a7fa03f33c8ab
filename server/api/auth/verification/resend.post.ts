// POST /api/auth/verification/resend — signed-in users whose address is not confirmed. 202
// {message}: a new link goes to the address; 409 when confirmed already; 429 after a few an hour.
import { MESSAGES } from '#shared/constants/messages'
import { resendConfirmation } from '#domain/people/account-links'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  const email = await resendConfirmation(user.id, siteUrl(event))
  setResponseStatus(event, 202)
  return { message: MESSAGES.verificationSent(email) }
})
