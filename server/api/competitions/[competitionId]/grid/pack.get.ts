// GET /api/competitions/:competitionId/grid/pack?day=YYYY-MM-DD — scrutineer, director or organiser.
// The day's GridPack for the phone (day defaults to today in the competition's time zone); never cached.
import { STAFF_ROLES } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import { competitionParamsSchema } from '#shared/schemas/params'
import { gridPackQuerySchema } from '#shared/schemas/grid'
import type { GridPack } from '#shared/types/api-grid'
import { gridPack } from '#domain/grid/grid-pack'

export default defineApiHandler(async (event): Promise<GridPack> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, gridPackQuerySchema)
  await requireRole(event, competitionId, STAFF_ROLES)
  const pack = await gridPack(competitionId, day)
  if (!pack) throw httpError(404, MESSAGES.competitionNotFound)
  setHeader(event, 'cache-control', 'no-store')
  return pack
})
