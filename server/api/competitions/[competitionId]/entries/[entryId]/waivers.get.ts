// GET /api/competitions/:competitionId/entries/:entryId/waivers — the entry's own entrant or the
// competition's staff. Its waivers, in force and withdrawn, newest first (EntryWaiver[]).
import { entryParamsSchema } from '#shared/schemas/params'
import type { EntryWaiver } from '#shared/types/api-board'
import { entryWaivers } from '#domain/board/director'

export default defineApiHandler(async (event): Promise<EntryWaiver[]> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryWaivers(access, entryId)
})
