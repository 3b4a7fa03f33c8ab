// GET /api/competitions/:competitionId/memberships — organisers (and site administrators).
// Everyone who holds a role in the competition, with their roles.
import { competitionParamsSchema } from '#shared/schemas/params'
import { listMembers } from '#domain/people/memberships'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, ['organiser'])
  return { members: await listMembers(competitionId) }
})
