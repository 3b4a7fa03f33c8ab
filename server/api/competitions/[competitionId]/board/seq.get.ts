// GET /api/competitions/:competitionId/board/seq — staff. The board's sequence number and open
// day: a screen compares it with its own now and then, so a missed push never goes unnoticed.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import type { BoardSeq } from '#shared/types/api-board'
import { boardSeq } from '#domain/board/transaction'

export default defineApiHandler(async (event): Promise<BoardSeq> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, STAFF_ROLES)
  setResponseHeader(event, 'cache-control', 'no-store')
  return boardSeq(competitionId)
})
