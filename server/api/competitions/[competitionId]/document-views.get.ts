// GET /api/competitions/:competitionId/document-views?page=&pageSize= — the competition's organisers.
// Every opening of a medical or licence file in the competition: entry, kind, viewer, role, when, address.
import { competitionParamsSchema } from '#shared/schemas/params'
import { documentViewsQuerySchema } from '#shared/schemas/document-views'
import { competitionDocumentViews } from '#domain/files/document-views'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, documentViewsQuerySchema)
  await requireRole(event, competitionId, ['organiser'])
  return competitionDocumentViews(competitionId, query)
})
