// GET /api/competitions/:competitionId/entries/:entryId/timeline — the entry's own entrant or
// staff. Every grid check, finding change, hold, release and waiver, with who and when.
import { entryParamsSchema } from '#shared/schemas/params'
import type { EntryTimeline } from '#shared/types/api-board'
import { entryTimeline } from '#domain/audit/audit-log'

export default defineApiHandler(async (event): Promise<EntryTimeline> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { entry } = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryTimeline(competitionId, entry)
})
