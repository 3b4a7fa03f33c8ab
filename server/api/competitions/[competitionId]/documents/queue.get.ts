// GET /api/competitions/:competitionId/documents/queue — scrutineers and organisers.
// Current documents awaiting review across all entries, oldest upload first.
import { competitionParamsSchema } from '#shared/schemas/params'
import { documentQueue } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, ['scrutineer', 'organiser'])
  return documentQueue(competitionId)
})
