// GET /api/competitions/:competitionId/tracking.json?board=today|YYYY-MM-DD — staff. The tracking
// list as JSON (TrackingList): one row per collision-warning unit of each accepted entry.
import { competitionParamsSchema } from '#shared/schemas/params'
import { trackingQuerySchema } from '#shared/schemas/reports'
import type { TrackingList } from '#shared/types/api-reports'
import { trackingFilename, trackingList } from '#domain/reports/tracking-list'

export default defineApiHandler(async (event): Promise<TrackingList> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, trackingQuerySchema)
  const access = await requireRole(event, competitionId, 'any')
  const list = await trackingList(access, query)
  setResponseHeaders(event, {
    'content-disposition': `attachment; filename="${trackingFilename(access.competition.slug, list.boardDay, 'json')}"`,
    'cache-control': 'no-store',
  })
  return list
})
