// POST /api/competitions/:competitionId/days {day?, kind?} — the contest director. Opens the
// day (today by default): 201 {day, created:true}; the day already open → 200 created:false.
import { competitionParamsSchema } from '#shared/schemas/params'
import { dayOpenBodySchema } from '#shared/schemas/board'
import type { BoardDay } from '#shared/types/api-board'
import { openDay } from '#domain/board/days'

export default defineApiHandler(async (event): Promise<{ day: BoardDay, created: boolean }> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const body = await validBody(event, dayOpenBodySchema)
  const access = await requireRole(event, competitionId, ['director'])
  const result = await openDay(access, body)
  setResponseStatus(event, result.created ? 201 : 200)
  return result
})
