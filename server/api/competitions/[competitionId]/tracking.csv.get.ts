// GET /api/competitions/:competitionId/tracking.csv?board=today|YYYY-MM-DD — staff. The tracking
// list (competition ID, registration, glider type, class, pilot, radio ID) as a CSV download.
import { competitionParamsSchema } from '#shared/schemas/params'
import { trackingQuerySchema } from '#shared/schemas/reports'
import { trackingCsv, trackingFilename, trackingList } from '#domain/reports/tracking-list'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, trackingQuerySchema)
  const access = await requireRole(event, competitionId, 'any')
  const list = await trackingList(access, query)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${trackingFilename(access.competition.slug, list.boardDay, 'csv')}"`,
    'cache-control': 'no-store',
  })
  return trackingCsv(list)
})
