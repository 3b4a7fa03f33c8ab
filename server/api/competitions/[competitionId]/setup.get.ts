// GET /api/competitions/:competitionId/setup — organisers (and site administrators).
// Everything the set-up form shows: fields, days, registration and fees, rules, classes.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { CompetitionSetupResponse } from '#shared/types/setup'
import { competitionSetup } from '#domain/competitions/setup'

export default defineApiHandler(async (event): Promise<CompetitionSetupResponse> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, ['organiser'])
  return competitionSetup(competitionId)
})
