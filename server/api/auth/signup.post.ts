// POST /api/auth/signup {email,name,password} — anyone. 201 {user} and signed in;
// 400 with per-field messages; 409 when the e-mail address already has an account;
// 429 when this address has asked too often.
import { signUpSchema } from '#shared/schemas/auth'
import { throttleByAddress } from '#domain/people/login-limit'
import { startSession } from '#domain/people/sessions'
import { signUpUser, toPublicUser } from '#domain/people/users'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, signUpSchema)
  await throttleByAddress(event, 'signUpLimit')
  const passwordHash = await hashPassword(body.password)
  const user = await signUpUser({ email: body.email, name: body.name, passwordHash })

  await startSession(event, user)
  setResponseStatus(event, 201)
  return { user: toPublicUser(user) }
})
