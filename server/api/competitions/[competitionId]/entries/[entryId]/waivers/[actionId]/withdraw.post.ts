// POST /api/competitions/:competitionId/entries/:entryId/waivers/:actionId/withdraw {reason} —
// the contest director (who grants waivers). The waiver counts no more; audited, pushed, e-mailed.
import { waiverParamsSchema, waiverWithdrawBodySchema } from '#shared/schemas/board'
import type { DirectorActionResult } from '#shared/types/api-board'
import { withdrawWaiver } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<DirectorActionResult> => {
  const { competitionId, entryId, actionId } = await validParams(event, waiverParamsSchema)
  const body = await validBody(event, waiverWithdrawBodySchema)
  const access = await requireRole(event, competitionId, ['director'])
  return withdrawWaiver(access, entryId, actionId, body)
})
