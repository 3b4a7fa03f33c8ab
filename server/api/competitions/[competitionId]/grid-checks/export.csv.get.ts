// GET /api/competitions/:competitionId/grid-checks/export.csv?day= — staff. The scrutineering
// log: every grid check (of one day, or all) with its answers and outcome, as a CSV download.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { gridLogExportQuerySchema } from '#shared/schemas/board'
import { gridLogCsv } from '#domain/board/exports'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, gridLogExportQuerySchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  const csv = await gridLogCsv(competition, day)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${competition.slug}-scrutineering-log${day ? `-${day}` : ''}.csv"`)
  return csv
})
