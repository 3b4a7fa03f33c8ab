// DELETE /api/competitions/:competitionId/memberships/:membershipId — organisers (and site
// administrators). Removes one role of one person; the last organiser cannot be removed.
import { membershipParamsSchema } from '#shared/schemas/invitation'
import { removeMembership } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const { competitionId, membershipId } = await validParams(event, membershipParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  await removeMembership(competitionId, membershipId, user)
  setResponseStatus(event, 204)
  return null
})
