// GET …/entries/:entryId/igc-files/:igcFileId/file — the entry's entrant or the competition's staff.
// The stored IGC file exactly as uploaded, as a sandboxed plain-text download.
import { MESSAGES } from '#shared/constants/messages'
import { entryIgcParamsSchema } from '#shared/schemas/files'
import { findEntryIgcFile } from '#domain/files/igc-files'
import { readFile } from '#domain/files/storage'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, igcFileId } = await validParams(event, entryIgcParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const file = await findEntryIgcFile(entryId, igcFileId)
  if (!file) throw httpError(404, MESSAGES.igcFileNotFound)
  const data = await readFile(file.storage_key)
  if (!data) throw httpError(404, MESSAGES.fileUnavailable)
  setResponseHeaders(event, storedFileHeaders('text/plain; charset=utf-8', file.original_filename, data.byteLength))
  return data
})
