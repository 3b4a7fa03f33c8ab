// DELETE /api/competitions/:competitionId/classes/:classId — organisers. 204; 409 while any
// entry is in the class.
import { classParamsSchema } from '#shared/schemas/competition'
import { deleteCompetitionClass } from '#domain/competitions/setup'

export default defineApiHandler(async (event) => {
  const { competitionId, classId } = await validParams(event, classParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  await deleteCompetitionClass(competitionId, classId, user.id)
  setResponseStatus(event, 204)
  return null
})
