// POST /api/competitions/:competitionId/entries/:entryId/withdraw — its entrant. Any status
// but withdrawn → withdrawn (final); its competition ID becomes free again.
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier, withdrawEntry } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner')
  await withdrawEntry(access)
  return loadDossier(access)
})
