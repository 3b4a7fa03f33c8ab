// POST …/entries/:entryId/documents (multipart: file, kind, expiresOn) — the entry's entrant or staff.
// PDF, JPEG or PNG by content, ≤ 10 MB (413 / 415 otherwise); replaces the current one of its kind.
import { DOCUMENT_MAX_BYTES } from '#shared/constants/files'
import { MESSAGES } from '#shared/constants/messages'
import { documentUploadSchema, entryParamsSchema } from '#shared/schemas/files'
import { createDocument, detectDocumentType } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const upload = await readUpload(event, { maxBytes: DOCUMENT_MAX_BYTES, tooLarge: MESSAGES.documentTooLarge, fields: documentUploadSchema })
  const mediaType = await detectDocumentType(upload.head)
  if (!mediaType) throw httpError(415, MESSAGES.documentWrongType)
  const document = await createDocument({
    competitionId,
    entryId,
    actorUserId: access.user.id,
    kind: upload.fields.kind,
    expiresOn: upload.fields.expiresOn,
    filename: upload.filename,
    mediaType,
    file: upload,
  })
  setResponseStatus(event, 201)
  return { document }
})
