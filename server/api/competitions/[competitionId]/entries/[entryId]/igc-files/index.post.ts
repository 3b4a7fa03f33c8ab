// POST …/entries/:entryId/igc-files (multipart: file, optional unitId) — the entry's entrant or staff.
// ≤ 5 MB (413); a file that is not IGC gets 400 with the first error and its line, and nothing is stored.
import { IGC_MAX_BYTES } from '#shared/constants/files'
import { MESSAGES } from '#shared/constants/messages'
import { entryParamsSchema, igcUploadSchema } from '#shared/schemas/files'
import { createIgcFile, parseIgcUpload } from '#domain/files/igc-files'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const upload = await readUpload(event, { maxBytes: IGC_MAX_BYTES, tooLarge: MESSAGES.igcTooLarge, fields: igcUploadSchema })
  const unitId = upload.fields.unitId ?? null
  if (unitId) await requireEntryRecorder(entryId, unitId)
  const parsed = await parseIgcUpload(upload.path)
  if (!parsed.ok) {
    throw httpError(400, MESSAGES.notIgc(parsed.error.message, parsed.error.line), {
      fieldErrors: { file: [MESSAGES.notIgc(parsed.error.message, parsed.error.line)] },
      formErrors: [],
      line: parsed.error.line,
    })
  }
  const igcFile = await createIgcFile({
    competitionId,
    entryId,
    unitId,
    actorUserId: access.user.id,
    filename: upload.filename,
    file: upload,
    header: parsed.header,
    errors: parsed.errors,
  })
  setResponseStatus(event, 201)
  return { igcFile }
})
