// GET /api/invitations/:token — anyone holding the link. What it invites to; 404 for a link
// that is not valid, 410 with the reason for one that was used, withdrawn or has expired.
import { invitationTokenParamsSchema } from '#shared/schemas/invitation'
import { MESSAGES } from '#shared/constants/messages'
import { previewInvitation } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const parsed = invitationTokenParamsSchema.safeParse(getRouterParams(event, { decode: true }))
  if (!parsed.success) throw httpError(404, MESSAGES.invitationInvalid)
  return await previewInvitation(parsed.data.token)
})
