// GET /api/competitions/:competitionId/entries/:entryId/grid-checks — its entrant or the
// competition's staff. The entry's grid checks, newest day and check first (GridCheckList).
import { entryParamsSchema } from '#shared/schemas/entry'
import type { GridCheckList } from '#shared/types/api-grid'
import { entryGridChecks } from '#domain/grid/grid-checks'

export default defineApiHandler(async (event): Promise<GridCheckList> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryGridChecks(competitionId, entryId)
})
