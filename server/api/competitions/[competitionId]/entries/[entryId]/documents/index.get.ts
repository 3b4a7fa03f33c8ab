// GET …/entries/:entryId/documents — the entry's entrant or the competition's staff.
// The current document of each kind, and the replaced ones as history (newest first).
import { entryParamsSchema } from '#shared/schemas/files'
import { listDocuments } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return listDocuments(entryId)
})
