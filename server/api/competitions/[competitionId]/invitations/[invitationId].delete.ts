// DELETE /api/competitions/:competitionId/invitations/:invitationId — organisers (and site
// administrators). Withdraws an invitation that has not been accepted; its link stops working.
import { invitationParamsSchema } from '#shared/schemas/invitation'
import { revokeInvitation } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const { competitionId, invitationId } = await validParams(event, invitationParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return { invitation: await revokeInvitation(competitionId, invitationId, user) }
})
