// GET /api/competitions/:competitionId/board/entries/:entryId?day= — staff. One entry on the
// board: its tile, its findings with the waivers that lift them, the director's actions.
import { STAFF_ROLES } from '#shared/constants/roles'
import { entryParamsSchema } from '#shared/schemas/params'
import { boardQuerySchema } from '#shared/schemas/board'
import type { BoardEntryDetail } from '#shared/types/api-board'
import { boardEntryDetail } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<BoardEntryDetail> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { day } = await validQuery(event, boardQuerySchema)
  const access = await requireRole(event, competitionId, STAFF_ROLES)
  setResponseHeader(event, 'cache-control', 'no-store')
  return boardEntryDetail(access, entryId, day)
})
