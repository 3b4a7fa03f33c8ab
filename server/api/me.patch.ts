// PATCH /api/me {name} — signed-in users. 200 {user} with the new name (audited; entries keep
// the pilot's name as entered); 400 bad body; 401 signed out.
import { accountNameSchema } from '#shared/schemas/account'
import type { AccountNameResponse } from '#shared/types/api-account'
import { renameAccount } from '#domain/people/account'

export default defineApiHandler(async (event): Promise<AccountNameResponse> => {
  const user = await requireUser(event)
  const body = await validBody(event, accountNameSchema)
  return { user: await renameAccount(event, user, body) }
})
