// GET …/entries/:entryId/documents/:documentId/file — the entry's entrant or the competition's staff.
// The stored file, shown inline with its detected type; nosniff so a browser never guesses another.
import { MESSAGES } from '#shared/constants/messages'
import { entryDocumentParamsSchema } from '#shared/schemas/files'
import { findEntryDocument } from '#domain/files/documents'
import { readFile } from '#domain/files/storage'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, documentId } = await validParams(event, entryDocumentParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const document = await findEntryDocument(entryId, documentId)
  if (!document) throw httpError(404, MESSAGES.documentNotFound)
  const data = await readFile(document.storage_key)
  if (!data) throw httpError(404, MESSAGES.fileUnavailable)
  setResponseHeaders(event, {
    'content-type': document.media_type,
    'content-length': data.byteLength,
    'content-disposition': contentDisposition('inline', document.original_filename),
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
  })
  return data
})
