// PATCH /api/competitions/:competitionId/entries/:entryId — its entrant until registration
// closes (draft, submitted or rejected), the organiser always. Fields left out stay; null or ''
// clears an optional one. Answers the new dossier; 409 on a taken competition ID.
import { entryParamsSchema, entryPatchSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier, updateEntry } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const patch = await validBody(event, entryPatchSchema)
  await updateEntry(access, patch)
  return loadDossier(access)
})
