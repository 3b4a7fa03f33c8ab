// POST /api/competitions/:competitionId/entries/:entryId/withdraw {reason?} — its entrant, or
// the organiser for the pilot (reason required). Any status but withdrawn → withdrawn (final).
import { entryParamsSchema, entryWithdrawSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier, withdrawEntry } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const body = await validBody(event, entryWithdrawSchema.optional())
  await withdrawEntry(access, body ?? {})
  return loadDossier(access)
})
