// GET /api/competitions/:competitionId/days — staff. The scheduled practice and contest days,
// the days opened so far with who opened and closed them, today and the open day (DayList).
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import type { DayList } from '#shared/types/api-board'
import { dayList } from '#domain/board/days'

export default defineApiHandler(async (event): Promise<DayList> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  return dayList(competition)
})
