// POST /api/invitations/:token/accept — any signed-in user holding the link (right after
// sign-up or sign-in). Creates the membership; the link then stops working.
import { invitationTokenParamsSchema } from '#shared/schemas/invitation'
import { MESSAGES } from '#shared/constants/messages'
import { acceptInvitation } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const parsed = invitationTokenParamsSchema.safeParse(getRouterParams(event, { decode: true }))
  if (!parsed.success) throw httpError(404, MESSAGES.invitationInvalid)
  const user = requireVerified(await requireUser(event))
  return await acceptInvitation(parsed.data.token, user)
})
