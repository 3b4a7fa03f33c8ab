// GET /api/competitions/:competitionId/board?day= — staff (organiser, scrutineer, director).
// The board of a day (the open day, else the latest) at one sequence number: BoardSnapshot.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { boardQuerySchema } from '#shared/schemas/board'
import type { BoardSnapshot } from '#shared/types/api-board'

export default defineApiHandler(async (event): Promise<BoardSnapshot> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, boardQuerySchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  setResponseHeader(event, 'cache-control', 'no-store')
  return boardSnapshot(competition, day)
})
