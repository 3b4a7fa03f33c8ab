// DELETE /api/me {password, confirm: 'delete'} — signed-in users. 200 {ok, withdrawn, kept}
// and the cookie cleared; 400 wrong password (counted as a failed sign-in) or no confirmation;
// 409 naming the competitions the caller is the only organiser of, or as the only site admin.
import { accountDeleteSchema } from '#shared/schemas/account'
import type { AccountDeleteResponse } from '#shared/types/api-account'
import { deleteAccount } from '#domain/account/deletion'

export default defineApiHandler(async (event): Promise<AccountDeleteResponse> => {
  const user = await requireUser(event)
  const body = await validBody(event, accountDeleteSchema)
  return deleteAccount(event, user, body)
})
