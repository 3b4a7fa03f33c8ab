// POST /api/me/email {email,password} — signed-in users. 202 {message}: a link goes to the new
// address, which replaces the current one only once opened; the same answer when the address
// belongs to another account (nothing is sent or changed). 400 wrong password or bad address.
import { emailChangeSchema } from '#shared/schemas/account'
import { MESSAGES } from '#shared/constants/messages'
import { requestEmailChange } from '#domain/people/account-links'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  const body = await validBody(event, emailChangeSchema)
  await requestEmailChange(user.id, body, siteUrl(event))
  setResponseStatus(event, 202)
  return { message: MESSAGES.emailChangeCheckMail(body.email) }
})
