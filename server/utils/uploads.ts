// Receiving one uploaded file and its text fields from a multipart form, streamed: the file
// goes to a temporary file on disk as it arrives, hashed (sha-256) on the way, and only its
// first bytes stay in memory (enough to tell its type). The size limit is enforced before the
// body is read (Content-Length) and while it streams (a chunked body): past it the answer is
// 413 at once, the rest of the body is not kept (the connection is dropped soon after the
// answer) and the temporary file is removed. The temporary file never outlives the request:
// a domain function that keeps the file moves it into storage before the response ends
// (server/domain/files/storage.ts).
import { createHash, randomUUID } from 'node:crypto'
import { createWriteStream } from 'node:fs'
import { mkdir, readFile, rm } from 'node:fs/promises'
import type { IncomingMessage } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Transform, type Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import busboy from 'busboy'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from './errors'
import { assertPlainText } from './validation'

export interface Upload<F> {
  filename: string
  /** The received file, on local disk until it is stored or the response ends. */
  path: string
  size: number
  /** sha-256 of the file's bytes, hex. */
  sha256: string
  /** The first bytes of the file (at most HEAD_BYTES): enough to recognise its type. */
  head: Buffer
  fields: F
}

/** Room for the form's boundaries and text fields on top of the file's own limit. */
const FORM_OVERHEAD_BYTES = 64 * 1024
/** What file-type reads to recognise a file. */
const HEAD_BYTES = 4100
/** How long a refused upload's connection stays open once the answer has gone. */
const LINGER_MS = 5000
/** Text fields of the app's upload forms are short. */
const FIELD_MAX_BYTES = 8 * 1024

/** Where uploads wait until they are whole and valid (NUXT_UPLOADS_TMP_DIR, else the system's). */
function incomingFolder(): string {
  return process.env.NUXT_UPLOADS_TMP_DIR || join(tmpdir(), 'gridmark-incoming')
}

interface Received {
  text: Record<string, string>
  file?: { filename: string, path: string, size: number, sha256: string, head: Buffer }
}

interface FormLimits {
  maxFileBytes: number
  tooLarge: string
  /** The part that holds the file; any part with a file name when not given. */
  fileField?: string
  maxFieldBytes: number
}

const RAW_BODY = Symbol.for('h3RawBody') // set when a body was already read whole (validation.ts)

/**
 * Reads the form of the request: its file part to a temporary file, the text parts into
 * memory. Rejects with 413 past the file's limit or the whole body's (the file's limit plus
 * the overhead), 400 for a broken or interrupted form.
 */
function receiveForm(event: H3Event, limits: FormLimits): Promise<Received> {
  const req = event.node.req as IncomingMessage & { [RAW_BODY]?: Promise<Buffer> }
  const res = event.node.res
  const { maxFileBytes, tooLarge } = limits
  const declared = Number.parseInt(req.headers['content-length'] ?? '', 10)
  if (declared > maxFileBytes + FORM_OVERHEAD_BYTES) return Promise.reject(httpError(413, tooLarge))
  return new Promise<Received>((resolve, reject) => {
    let form: busboy.Busboy
    try {
      form = busboy({
        headers: req.headers,
        defParamCharset: 'utf8',
        limits: { files: 1, fileSize: maxFileBytes, fields: 20, fieldSize: limits.maxFieldBytes, parts: 30, headerPairs: 50 },
      })
    }
    catch {
      reject(httpError(400, MESSAGES.multipartRequired))
      return
    }
    const text: Record<string, string> = {}
    let fileStream: Readable | undefined
    let spooling: Promise<Received['file']> | undefined
    let tempPath: string | undefined
    let settled = false
    let total = 0

    const fail = (error: unknown) => {
      if (settled) return
      settled = true
      req.unpipe(form)
      fileStream?.destroy()
      form.destroy()
      // Read no more while the answer is made. Once it has gone, read and throw away what the
      // client still sends for a moment (closing at once could lose the answer on its way),
      // then drop the connection.
      req.pause()
      res.once('finish', () => {
        req.resume()
        setTimeout(() => req.socket?.destroy(), LINGER_MS).unref()
      })
      const path = tempPath
      void (spooling ?? Promise.resolve()).catch(() => undefined).finally(() => {
        if (path) void rm(path, { force: true })
      })
      reject(error)
    }

    form.on('field', (name, value, info) => {
      if (info.nameTruncated || info.valueTruncated) return fail(httpError(413, tooLarge))
      text[name] = value
    })
    form.on('file', (name, stream, info) => {
      if (spooling || settled || (limits.fileField && name !== limits.fileField) || !info.filename) {
        stream.resume()
        return
      }
      // After busboy's own bookkeeping of the limit (it touches the stream right after).
      stream.on('limit', () => process.nextTick(fail, httpError(413, tooLarge)))
      fileStream = stream
      tempPath = join(incomingFolder(), randomUUID())
      spooling = spool(stream, tempPath, info.filename)
      spooling.catch(fail)
    })
    form.on('partsLimit', () => fail(httpError(413, tooLarge)))
    form.on('fieldsLimit', () => fail(httpError(413, tooLarge)))
    form.on('error', () => fail(httpError(400, MESSAGES.multipartRequired)))
    form.on('close', () => {
      void (spooling ?? Promise.resolve(undefined)).then((file) => {
        if (settled) return
        settled = true
        resolve({ text, file })
      }, fail)
    })

    const buffered = req[RAW_BODY]
    if (buffered) {
      void buffered.then(body => form.end(body), fail)
      return
    }
    req.on('data', (chunk: Buffer) => {
      total += chunk.length
      if (total > maxFileBytes + FORM_OVERHEAD_BYTES) fail(httpError(413, tooLarge))
    })
    req.on('error', () => fail(httpError(400, MESSAGES.uploadInterrupted)))
    req.on('close', () => {
      if (!req.complete) fail(httpError(400, MESSAGES.uploadInterrupted))
    })
    req.pipe(form)
  })
}

/** Writes the file part to `path`, hashing it and keeping its first bytes on the way. */
async function spool(stream: Readable, path: string, filename: string): Promise<NonNullable<Received['file']>> {
  await mkdir(incomingFolder(), { recursive: true })
  const hash = createHash('sha256')
  const head: Buffer[] = []
  let headSize = 0
  let size = 0
  const tap = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      hash.update(chunk)
      size += chunk.length
      if (headSize < HEAD_BYTES) {
        const part = chunk.subarray(0, HEAD_BYTES - headSize)
        head.push(Buffer.from(part))
        headSize += part.length
      }
      done(null, chunk)
    },
  })
  await pipeline(stream, tap, createWriteStream(path, { flags: 'wx' }))
  return { filename, path, size, sha256: hash.digest('hex'), head: Buffer.concat(head) }
}

export async function readUpload<S extends z.ZodType>(
  event: H3Event,
  options: { maxBytes: number, tooLarge: string, fields: S },
): Promise<Upload<z.output<S>>> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data/i.test(type)) throw httpError(400, MESSAGES.multipartRequired)
  const { text, file } = await receiveForm(event, { maxFileBytes: options.maxBytes, tooLarge: options.tooLarge, fileField: 'file', maxFieldBytes: FIELD_MAX_BYTES })
  // Whatever the handler does next, the temporary file does not outlive the request.
  if (file) event.node.res.once('close', () => void rm(file.path, { force: true }))
  assertPlainText(text)
  // Fields first, so a form with a wrong date and no file hears about both at once.
  const parsed = options.fields.safeParse(text)
  if (!file || file.size === 0) {
    const fieldErrors = parsed.success ? {} : fieldErrorsOf(parsed.error)
    throw httpError(400, MESSAGES.fileMissing, { fieldErrors: { ...fieldErrors, file: [MESSAGES.fileMissing] }, formErrors: [] })
  }
  if (!parsed.success) throw parsed.error
  return { filename: cleanFilename(file.filename), path: file.path, size: file.size, sha256: file.sha256, head: file.head, fields: parsed.data }
}

/**
 * The text of a CSV file sent in a multipart form: its first file part, or else a text part
 * named `file` or `csv`; at most `maxBytes`. Streamed like any upload, then read whole (it is
 * small, and parsed whole anyway). Undefined when the form holds neither.
 */
export async function readUploadedCsv(event: H3Event, maxBytes: number, tooLarge: string): Promise<string | undefined> {
  const { text, file } = await receiveForm(event, { maxFileBytes: maxBytes, tooLarge, maxFieldBytes: maxBytes })
  if (!file) return text.file ?? text.csv
  try {
    return await readFile(file.path, 'utf8')
  }
  finally {
    await rm(file.path, { force: true })
  }
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
