// POST /api/competitions/:competitionId/grid-checks — scrutineer, director or organiser (a site admin only where they hold one).
// Records a grid check: 201 {gridCheck, replayed:false}; same key and body again → 200 replayed; Server-Timing: auth, lock, write, commit, emit, push.
import { competitionParamsSchema } from '#shared/schemas/params'
import { gridCheckBodySchema } from '#shared/schemas/grid'
import type { GridCheckResult } from '#shared/types/api-grid'
import { recordGridCheck } from '#domain/grid/grid-checks'

export default defineApiHandler(event => withServerTiming(event, async (): Promise<GridCheckResult> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const body = await validBody(event, gridCheckBodySchema)
  const { user, competition } = await requireGridRecorder(event, competitionId)
  markTiming('auth')
  const result = await recordGridCheck(competition, user, body)
  setResponseStatus(event, result.replayed ? 200 : 201)
  return result
}))
