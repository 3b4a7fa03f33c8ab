// PATCH /api/competitions/:competitionId — organisers (and site administrators). Any subset
// of the set-up fields; the result must hold together as a whole. Answers the full set-up.
import { competitionParamsSchema } from '#shared/schemas/params'
import { competitionSetupPatchSchema } from '#shared/schemas/competition'
import { updateCompetitionSetup } from '#domain/competitions/setup'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const body = await validBody(event, competitionSetupPatchSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return updateCompetitionSetup(competitionId, body, user.id)
})
