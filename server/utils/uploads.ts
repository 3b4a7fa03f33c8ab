// Reading one uploaded file and its text fields from a multipart form, with the size limit
// enforced before the body is read (Content-Length), while it streams (a chunked body), and
// again on the file itself. The form is held in memory once read (at most the limit).
import type { H3Event } from 'h3'
import type { z } from 'zod'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from './errors'
import { assertPlainText, readLimitedBody } from './validation'

export interface Upload<F> {
  filename: string
  data: Buffer
  fields: F
}

/** Room for the form's boundaries and text fields on top of the file's own limit. */
const FORM_OVERHEAD_BYTES = 64 * 1024

export async function readUpload<S extends z.ZodType>(
  event: H3Event,
  options: { maxBytes: number, tooLarge: string, fields: S },
): Promise<Upload<z.output<S>>> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data/i.test(type)) throw httpError(400, MESSAGES.multipartRequired)
  await readLimitedBody(event, options.maxBytes + FORM_OVERHEAD_BYTES, options.tooLarge)

  let parts: Awaited<ReturnType<typeof readMultipartFormData>>
  try {
    parts = await readMultipartFormData(event)
  }
  catch {
    throw httpError(400, MESSAGES.multipartRequired)
  }
  const file = parts?.find(p => p.name === 'file' && p.filename !== undefined)
  const text: Record<string, string> = {}
  for (const part of parts ?? []) {
    if (part.filename === undefined && part.name) text[part.name] = part.data.toString('utf8')
  }
  assertPlainText(text)
  // Fields first, so a form with a wrong date and no file hears about both at once.
  const parsed = options.fields.safeParse(text)
  if (!file || file.data.length === 0) {
    const fieldErrors = parsed.success ? {} : fieldErrorsOf(parsed.error)
    throw httpError(400, MESSAGES.fileMissing, { fieldErrors: { ...fieldErrors, file: [MESSAGES.fileMissing] }, formErrors: [] })
  }
  if (file.data.length > options.maxBytes) throw httpError(413, options.tooLarge)
  if (!parsed.success) throw parsed.error
  return { filename: cleanFilename(file.filename ?? 'upload'), data: file.data, fields: parsed.data }
}

function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? '')
    if (!key) continue
    ;(out[key] ??= []).push(issue.message)
  }
  return out
}

/** The name as the entrant's computer called it, without folders or control characters. */
export function cleanFilename(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex -- stripping control characters is the point
  const cleaned = base.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, 200)
  return cleaned || 'upload'
}

/** A Content-Disposition value that survives any file name (RFC 6266 with RFC 5987 filename*). */
export function contentDisposition(kind: 'inline' | 'attachment', filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_')
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`
}

/** Types a browser shows by itself without running anything: viewed inline, all else downloaded. */
const SHOWN_INLINE = new Set(['application/pdf', 'image/png', 'image/jpeg', 'image/webp', 'image/gif'])

/**
 * The headers of a stored upload sent back: its type as detected at upload, never sniffed;
 * sandboxed, so even a file that is a page in disguise runs nothing and reaches no cookie;
 * framed by this site's own pages only (the document review shows a PDF in a frame); a PDF
 * or an image inline, anything else as a download.
 */
export function storedFileHeaders(mediaType: string, filename: string, bytes: number): Record<string, string | number> {
  return {
    'content-type': mediaType,
    'content-length': bytes,
    'content-disposition': contentDisposition(SHOWN_INLINE.has(mediaType) ? 'inline' : 'attachment', filename),
    'content-security-policy': 'sandbox; default-src \'none\'; img-src \'self\' data:; style-src \'unsafe-inline\'; frame-ancestors \'self\'',
    'x-content-type-options': 'nosniff',
    'x-frame-options': 'SAMEORIGIN',
    'cache-control': 'private, no-store',
  }
}
