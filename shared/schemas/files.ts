// Params and form fields of document and IGC file uploads, and the review decision.
import { z } from 'zod'
import { DOCUMENT_KINDS } from '../constants/entries'
import { isoDate } from './competition'
import { entryParamsSchema, uuid } from './params'

export { entryParamsSchema }
export const entryDocumentParamsSchema = entryParamsSchema.extend({ documentId: uuid })
export const competitionDocumentParamsSchema = z.object({ competitionId: uuid, documentId: uuid })
export const entryIgcParamsSchema = entryParamsSchema.extend({ igcFileId: uuid })

/** The text fields sent beside a document's file. */
export const documentUploadSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS, { error: 'Choose what kind of document this is.' }),
  expiresOn: isoDate,
}, { error: 'Send the document’s kind and expiry date.' })
export type DocumentUpload = z.infer<typeof documentUploadSchema>

/** The text fields sent beside an IGC file: optionally, which flight recorder wrote it. */
export const igcUploadSchema = z.object({
  unitId: z.union([z.literal(''), uuid]).optional().transform(v => (v ? v : undefined)),
})
export type IgcUpload = z.infer<typeof igcUploadSchema>

/** Which flight recorder an IGC file came from, said after the upload. */
export const igcRecorderBodySchema = z.object({
  unitId: uuid,
}, { error: 'Send the flight recorder as { unitId }.' }).strict()

export const reviewBodySchema = z.discriminatedUnion('decision', [
  z.object({ decision: z.literal('accept') }),
  z.object({
    decision: z.literal('reject'),
    reason: z.string({ error: 'Say why the document is rejected.' }).trim()
      .min(3, { error: 'Say why the document is rejected.' })
      .max(500, { error: 'Keep the reason under 500 characters.' }),
  }),
], { error: 'Choose to accept or reject the document.' })
export type ReviewBody = z.infer<typeof reviewBodySchema>

/** POST /api/admin/retention/run: the job as of a chosen instant (the tests' clock), else now. */
export const retentionRunBodySchema = z.object({
  at: z.iso.datetime({ offset: true, error: 'Give the time as an ISO date-time, e.g. 2027-08-18T00:00:00Z.' }).optional(),
}, { error: 'Send the fields as a JSON object.' }).strict()
