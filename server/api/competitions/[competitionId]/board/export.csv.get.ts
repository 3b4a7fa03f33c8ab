// GET /api/competitions/:competitionId/board/export.csv?day= — staff. The day's readiness (the
// open day, else the latest), one row per entry, as a CSV download.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { boardQuerySchema } from '#shared/schemas/board'
import { MESSAGES } from '#shared/constants/messages'
import { stringify } from 'csv-stringify/sync'
import { readinessRecords } from '#domain/board/exports'
import { boardSnapshot } from '#domain/board/snapshot'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, boardQuerySchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  const board = await boardSnapshot(competition, day)
  if (!board.day) throw httpError(404, day ? MESSAGES.dayNotFound : MESSAGES.noOpenDay)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${competition.slug}-readiness-${board.day.day}.csv"`)
  return stringify(readinessRecords(board.day.day, board.tiles))
})
