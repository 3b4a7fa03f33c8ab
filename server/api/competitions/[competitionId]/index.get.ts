// GET /api/competitions/:competitionId — any member (and site administrators).
// The competition, its classes and the caller's roles; 404 to non-members.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { CompetitionDetail } from '#shared/types/api'
import { competitionDetail } from '#domain/competitions/competitions'

export default defineApiHandler(async (event): Promise<CompetitionDetail> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { competition, roles } = await requireRole(event, competitionId, 'any')
  return competitionDetail(competition, roles)
})
