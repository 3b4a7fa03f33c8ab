// GET …/entries/:entryId/documents/:documentId/file — the entry's entrant or staff; a medical or licence file only to the pilot, scrutineers and organisers.
// The stored file with its detected type, sandboxed, inline or a download; each opening of a medical or licence file is logged before it is sent; 410 once retention deleted it.
import { entryDocumentParamsSchema } from '#shared/schemas/files'
import { openDocumentFile } from '#domain/files/document-views'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, documentId } = await validParams(event, entryDocumentParamsSchema)
  const { access, document, loggedAs } = await requireDocumentFile(event, competitionId, entryId, documentId)
  const data = await openDocumentFile({ document, viewerUserId: access.user.id, loggedAs, clientAddress: clientAddress(event) })
  setResponseHeaders(event, storedFileHeaders(document.media_type, document.original_filename, data.byteLength))
  return data
})
