// GET /api/competitions/:competitionId/entries/:entryId/findings — its entrant or the
// competition's staff. The check engine's findings of the entry, blocking first, with counts.
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryFindings } from '#shared/types/api-findings'
import { entryFindings } from '#domain/findings/findings'

export default defineApiHandler(async (event): Promise<EntryFindings> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryFindings(competitionId, entryId)
})
