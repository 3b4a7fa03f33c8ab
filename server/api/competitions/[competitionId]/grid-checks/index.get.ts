// GET /api/competitions/:competitionId/grid-checks?day=YYYY-MM-DD — staff (organiser, scrutineer,
// director). Every grid check of that day, newest first (GridCheckList).
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { gridDayQuerySchema } from '#shared/schemas/grid'
import type { GridCheckList } from '#shared/types/api-grid'
import { dayGridChecks } from '#domain/grid/grid-checks'

export default defineApiHandler(async (event): Promise<GridCheckList> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, gridDayQuerySchema)
  await requireRole(event, competitionId, STAFF_ROLES)
  return dayGridChecks(competitionId, day)
})
