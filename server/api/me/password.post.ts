// POST /api/me/password {currentPassword, newPassword} — signed-in users. 200 {signedOut}: every
// other session ended, this one kept, the address e-mailed; 400 wrong current password (counted
// as a failed sign-in) or a weak new one; 401 signed out; 429 when throttled.
import { accountPasswordSchema } from '#shared/schemas/account'
import type { AccountPasswordResponse } from '#shared/types/api-account'
import { changeOwnPassword } from '#domain/people/account'

export default defineApiHandler(async (event): Promise<AccountPasswordResponse> => {
  const user = await requireUser(event)
  const body = await validBody(event, accountPasswordSchema)
  return changeOwnPassword(event, user, body)
})
