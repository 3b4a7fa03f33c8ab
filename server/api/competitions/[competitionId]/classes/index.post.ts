// POST /api/competitions/:competitionId/classes — organisers. Adds an FAI class (its default
// limits fill what the body leaves out) or a custom class. 201 with the class.
import { competitionParamsSchema } from '#shared/schemas/params'
import { classCreateSchema } from '#shared/schemas/competition'
import { createCompetitionClass } from '#domain/competitions/setup'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const body = await validBody(event, classCreateSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  const created = await createCompetitionClass(competitionId, body, user.id)
  setResponseStatus(event, 201)
  return created
})
