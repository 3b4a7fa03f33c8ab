// GET …/entries/:entryId/documents — the entry's entrant or the competition's staff.
// The current document of each kind, the replaced ones as history (newest first), and whether the caller opens medical and licence files.
import { entryParamsSchema } from '#shared/schemas/files'
import { listDocuments } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const reader = await documentReaderOf(access)
  return { ...await listDocuments(entryId, reader), fileAccess: reader }
})
