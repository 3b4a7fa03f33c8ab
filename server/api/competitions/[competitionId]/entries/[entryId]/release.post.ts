// POST /api/competitions/:competitionId/entries/:entryId/release {reason, day?} — the contest
// director. Ends the day's hold (a blocking finding needs a waiver); audited, pushed, e-mailed.
import { entryParamsSchema } from '#shared/schemas/params'
import { releaseBodySchema } from '#shared/schemas/board'
import type { DirectorActionResult } from '#shared/types/api-board'
import { holdOrRelease } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<DirectorActionResult> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const body = await validBody(event, releaseBodySchema)
  const access = await requireRole(event, competitionId, ['director'])
  setResponseStatus(event, 201)
  return holdOrRelease(access, entryId, 'release', body)
})
