// GET …/entries/:entryId/documents/:documentId/file — the entry's entrant or the competition's staff.
// The stored file, sandboxed: a PDF or an image inline, else a download; 410 once retention deleted it.
import { MESSAGES } from '#shared/constants/messages'
import { entryDocumentParamsSchema } from '#shared/schemas/files'
import { findEntryDocument } from '#domain/files/documents'
import { readFile } from '#domain/files/storage'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, documentId } = await validParams(event, entryDocumentParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const document = await findEntryDocument(entryId, documentId)
  if (!document) throw httpError(404, MESSAGES.documentNotFound)
  if (!document.storage_key) throw httpError(410, MESSAGES.documentFileDeleted)
  const data = await readFile(document.storage_key)
  if (!data) throw httpError(404, MESSAGES.fileUnavailable)
  setResponseHeaders(event, storedFileHeaders(document.media_type, document.original_filename, data.byteLength))
  return data
})
