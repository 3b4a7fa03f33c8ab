// GET /api/competitions/:competitionId/entries/:entryId — its entrant or the competition's
// staff. The whole dossier (EntryDossier): entry, class, units, extras, progress, permissions.
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return loadDossier(access)
})
