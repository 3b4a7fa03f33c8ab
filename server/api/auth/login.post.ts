// POST /api/auth/login {email,password} — anyone. 200 {user} and the session cookie;
// 401 alike for an unknown address and a wrong password; 400 bad body; 429 when throttled.
import { signInSchema } from '#shared/schemas/auth'
import { MESSAGES } from '#shared/constants/messages'
import { takeSignInAttempt } from '#domain/people/login-limit'
import { startSession } from '#domain/people/sessions'
import { findUserByEmail, toPublicUser, updatePasswordHash } from '#domain/people/users'

// Verified against when the address is unknown, so both failures take the same time.
let decoyHash: Promise<string> | undefined

export default defineApiHandler(async (event) => {
  const body = await validBody(event, signInSchema)
  // Counted as a failure before the password is checked, given back when it is right.
  const attempt = await takeSignInAttempt(event, body.email)

  const user = await findUserByEmail(body.email)
  decoyHash ??= hashPassword('decoy password for unknown accounts')
  const valid = await verifyPassword(user?.password_hash ?? await decoyHash, body.password)
  if (!user || !valid) throw httpError(401, MESSAGES.badCredentials)

  await attempt.succeeded()
  if (passwordNeedsReHash(user.password_hash)) {
    await updatePasswordHash(user.id, await hashPassword(body.password))
  }
  await startSession(event, user)
  return { user: toPublicUser(user) }
})
