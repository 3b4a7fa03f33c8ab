// POST /api/competitions/:competitionId/entries/:entryId/accept — the organiser. submitted →
// accepted; the entrant is e-mailed.
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { decideEntry, loadDossier } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  await decideEntry(access, { accept: true })
  return loadDossier(access)
})
