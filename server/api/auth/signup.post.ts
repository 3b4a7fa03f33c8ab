// POST /api/auth/signup {email,name,password,next?} — anyone. 202 {message} alike whether or not
// the address has an account (a new one gets a link to confirm it; an existing one a note), and
// nobody is signed in; 400 with per-field messages; 429 when this address has asked too often.
import { signUpSchema } from '#shared/schemas/auth'
import { MESSAGES } from '#shared/constants/messages'
import { throttleByAddress } from '#domain/people/login-limit'
import { signUp } from '#domain/people/account-links'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, signUpSchema)
  await throttleByAddress(event, 'signUpLimit')
  // Hashed in both cases, so an existing address answers no faster than a new one.
  const passwordHash = await hashPassword(body.password)
  await signUp({ email: body.email, name: body.name, passwordHash, next: body.next }, siteUrl(event))
  setResponseStatus(event, 202)
  return { message: MESSAGES.signUpCheckMail(body.email) }
})
