// POST /api/competitions/:competitionId/days/:day/close — the contest director. Closes the open
// day; its tiles stay as the record of how it ended. 404 unknown day, 409 already closed.
import { dayParamsSchema } from '#shared/schemas/board'
import type { BoardDay } from '#shared/types/api-board'
import { closeDay } from '#domain/board/days'

export default defineApiHandler(async (event): Promise<{ day: BoardDay }> => {
  const { competitionId, day } = await validParams(event, dayParamsSchema)
  const access = await requireRole(event, competitionId, ['director'])
  return { day: await closeDay(access, day) }
})
