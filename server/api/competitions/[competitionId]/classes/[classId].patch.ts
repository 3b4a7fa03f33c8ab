// PATCH /api/competitions/:competitionId/classes/:classId — organisers. Changes a class's
// name, limits, water ballast, entry fee or order. Answers the class.
import { classParamsSchema, classPatchSchema } from '#shared/schemas/competition'
import { updateCompetitionClass } from '#domain/competitions/setup'

export default defineApiHandler(async (event) => {
  const { competitionId, classId } = await validParams(event, classParamsSchema)
  const body = await validBody(event, classPatchSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return updateCompetitionClass(competitionId, classId, body, user.id)
})
