// Reads an uploaded CSV file from a request: a text/csv (or text/plain) body, the first file
// of a multipart form (streamed like any upload, see uploads.ts), or JSON {csv}. Size-capped
// while it streams; no control characters but tabs and line breaks.
import type { H3Event } from 'h3'
import { FIRMWARE_CSV_MAX_BYTES, firmwareImportJsonSchema } from '#shared/schemas/firmware'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from './errors'
import { readUploadedCsv } from './uploads'
import { controlCharacterError, hasControlCharacter, readLimitedBody, validBody } from './validation'

/** Room for JSON's quotes and escapes around the file. */
const CSV_BODY_MAX_BYTES = Math.ceil(FIRMWARE_CSV_MAX_BYTES * 1.1)

export async function readCatalogueUpload(event: H3Event): Promise<string> {
  const type = (getRequestHeader(event, 'content-type') ?? '').toLowerCase()
  let text: string
  if (type.startsWith('text/csv') || type.startsWith('text/plain') || type.startsWith('application/csv')) {
    await readLimitedBody(event, CSV_BODY_MAX_BYTES, MESSAGES.csvTooLarge)
    text = (await readRawBody(event, 'utf8')) ?? ''
  }
  else if (type.startsWith('multipart/form-data')) {
    const csv = await readUploadedCsv(event, FIRMWARE_CSV_MAX_BYTES, MESSAGES.csvTooLarge)
    if (csv === undefined) throw httpError(400, MESSAGES.csvEmpty)
    text = csv
  }
  else if (type.startsWith('application/json')) {
    text = (await validBody(event, firmwareImportJsonSchema, { maxBytes: CSV_BODY_MAX_BYTES, tooLarge: MESSAGES.csvTooLarge })).csv
  }
  else {
    throw httpError(415, MESSAGES.csvMediaType)
  }
  if (Buffer.byteLength(text, 'utf8') > FIRMWARE_CSV_MAX_BYTES) throw httpError(413, MESSAGES.csvTooLarge)
  if (!text.trim()) throw httpError(400, MESSAGES.csvEmpty)
  if (hasControlCharacter(text)) throw controlCharacterError(['csv'])
  return text
}
