// GET /api/competitions/:competitionId/findings — staff (organiser, scrutineer, director).
// Every entry's findings (blocking first), and how many each check raised by severity.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import type { CompetitionFindings } from '#shared/types/api-findings'
import { evaluateCompetition, summariseFindings } from '#domain/findings/findings'

export default defineApiHandler(async (event): Promise<CompetitionFindings> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, STAFF_ROLES)
  return summariseFindings(await evaluateCompetition(competitionId))
})
