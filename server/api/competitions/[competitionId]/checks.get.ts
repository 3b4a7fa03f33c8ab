// GET /api/competitions/:competitionId/checks — any member (and site administrators); 404 to others.
// The rulebook: every check with its rule, severity, source and this competition's settings that change it.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { Rulebook } from '#shared/types/api-rulebook'
import { competitionRulebook } from '#domain/findings/rulebook'

export default defineApiHandler(async (event): Promise<Rulebook> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { competition } = await requireRole(event, competitionId, 'any')
  return competitionRulebook(competition)
})
