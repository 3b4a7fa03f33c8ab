// POST /api/auth/login {email,password} — anyone. 200 {user} and the session cookie;
// 401 alike for an unknown address and a wrong password; 400 bad body; 429 when throttled.
import { signInSchema } from '#shared/schemas/auth'
import { MESSAGES } from '#shared/constants/messages'
import { clearFailedLogins, guardLoginAttempt, recordFailedLogin } from '#domain/people/login-limit'
import { startSession } from '#domain/people/sessions'
import { findUserByEmail, toPublicUser, updatePasswordHash } from '#domain/people/users'

// Verified against when the address is unknown, so both failures take the same time.
let decoyHash: Promise<string> | undefined

export default defineApiHandler(async (event) => {
  const body = await validBody(event, signInSchema)
  await guardLoginAttempt(event, body.email)

  const user = await findUserByEmail(body.email)
  decoyHash ??= hashPassword('decoy password for unknown accounts')
  const valid = await verifyPassword(user?.password_hash ?? await decoyHash, body.password)
  if (!user || !valid) {
    await recordFailedLogin(event, body.email)
    throw httpError(401, MESSAGES.badCredentials)
  }

  await clearFailedLogins(body.email)
  if (passwordNeedsReHash(user.password_hash)) {
    await updatePasswordHash(user.id, await hashPassword(body.password))
  }
  await startSession(event, user)
  return { user: toPublicUser(user) }
})
