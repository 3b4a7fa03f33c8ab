// POST /api/competitions/:competitionId/entries/:entryId/waivers {scope, checkId, unitId?,
// subject?, reason, day?} — the contest director. Waives one open finding for the open day or
// the whole competition; audited and pushed to the boards.
import { entryParamsSchema } from '#shared/schemas/params'
import { waiverBodySchema } from '#shared/schemas/board'
import type { DirectorActionResult } from '#shared/types/api-board'
import { waiveFinding } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<DirectorActionResult> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const body = await validBody(event, waiverBodySchema)
  const access = await requireRole(event, competitionId, ['director'])
  setResponseStatus(event, 201)
  return waiveFinding(access, entryId, body)
})
