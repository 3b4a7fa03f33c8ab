// POST /api/competitions — site administrators. Creates a competition (name, airfield, time
// zone, contest days) and makes an existing user, named by e-mail, its first organiser. 201 {id, slug}.
import { competitionCreateSchema } from '#shared/schemas/competition'
import { createCompetitionWithOrganiser } from '#domain/competitions/setup'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, competitionCreateSchema)
  const admin = await requireAdmin(event)
  const created = await createCompetitionWithOrganiser(body, admin.id)
  setResponseStatus(event, 201)
  return created
})
