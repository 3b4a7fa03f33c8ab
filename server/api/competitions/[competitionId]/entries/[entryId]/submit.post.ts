// POST /api/competitions/:competitionId/entries/:entryId/submit — its entrant, before
// registration closes. draft | rejected → submitted; 400 listing what is missing (data.missing).
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier, submitEntry } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner')
  await submitEntry(access)
  return loadDossier(access)
})
