// POST /api/competitions/:competitionId/entries/:entryId/reject — the organiser, with
// {reason}. submitted → rejected; the entrant is e-mailed the reason and may submit again.
import { entryParamsSchema, entryRejectSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { decideEntry, loadDossier } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  const { reason } = await validBody(event, entryRejectSchema)
  await decideEntry(access, { accept: false, reason })
  return loadDossier(access)
})
