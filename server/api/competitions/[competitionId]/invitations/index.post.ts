// POST /api/competitions/:competitionId/invitations — organisers (and site administrators).
// Invites an e-mail address to a role; the invitation e-mail is queued in the same transaction.
import { competitionParamsSchema } from '#shared/schemas/params'
import { invitationBodySchema } from '#shared/schemas/invitation'
import { createInvitation } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { user, competition } = await requireRole(event, competitionId, ['organiser'])
  const body = await validBody(event, invitationBodySchema)
  const invitation = await createInvitation(event, {
    competitionId,
    competitionName: competition.name,
    email: body.email,
    role: body.role,
    invitedBy: user,
  })
  setResponseStatus(event, 201)
  return { invitation }
})
