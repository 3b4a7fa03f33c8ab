// GET /api/competitions/:competitionId/invitations — organisers (and site administrators).
// Every invitation of the competition, newest first, with its state.
import { competitionParamsSchema } from '#shared/schemas/params'
import { listInvitations } from '#domain/people/invitations'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, ['organiser'])
  return { invitations: await listInvitations(competitionId) }
})
