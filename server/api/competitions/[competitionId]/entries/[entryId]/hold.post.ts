// POST /api/competitions/:competitionId/entries/:entryId/hold {reason, day?} — the contest
// director. Holds the glider on the open day; audited, pushed to the boards, e-mailed.
import { entryParamsSchema } from '#shared/schemas/params'
import { holdBodySchema } from '#shared/schemas/board'
import type { DirectorActionResult } from '#shared/types/api-board'
import { holdOrRelease } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<DirectorActionResult> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const body = await validBody(event, holdBodySchema)
  const access = await requireRole(event, competitionId, ['director'])
  setResponseStatus(event, 201)
  return holdOrRelease(access, entryId, 'hold', body)
})
