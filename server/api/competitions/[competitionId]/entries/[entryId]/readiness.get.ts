// GET /api/competitions/:competitionId/entries/:entryId/readiness — the entry's own entrant or
// staff. The entry on the open day's board: readiness, why, the director's hold, the last check.
import { entryParamsSchema } from '#shared/schemas/params'
import type { EntryDayReadiness } from '#shared/types/api-board'
import { entryDayReadiness } from '#domain/board/snapshot'

export default defineApiHandler(async (event): Promise<EntryDayReadiness> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  setResponseHeader(event, 'cache-control', 'no-store')
  return entryDayReadiness(competitionId, entryId)
})
