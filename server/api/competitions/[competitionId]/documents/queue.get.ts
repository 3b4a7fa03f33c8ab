// GET /api/competitions/:competitionId/documents/queue — scrutineers and organisers.
// Current documents awaiting review across all entries, oldest upload first, and whether the caller opens medical and licence files.
import { competitionParamsSchema } from '#shared/schemas/params'
import { documentQueue } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const access = await requireRole(event, competitionId, ['scrutineer', 'organiser'])
  const reader = await documentReaderOf(access)
  return { ...await documentQueue(competitionId, reader), fileAccess: reader }
})
