import { promisify } from 'node:util'
import { gzip } from 'node:zlib'
import type { H3Event } from 'h3'

const gzipAsync = promisify(gzip)

/** Below this, a gzip header and the work are not worth it (a board of a dozen tiles). */
export const GZIP_MIN_BYTES = 8 * 1024

/**
 * Whether an Accept-Encoding header takes gzip (RFC 9110 §12.5.3): `gzip` or `*` with a
 * weight above 0 — `gzip;q=0` refuses it, and so does `*;q=0` when gzip is not named.
 */
export function acceptsGzip(header: string | undefined): boolean {
  if (!header) return false
  let star: boolean | undefined
  for (const part of header.split(',')) {
    const [name = '', ...params] = part.split(';').map(s => s.trim().toLowerCase())
    const q = params.find(p => p.startsWith('q='))
    const weight = q ? Number(q.slice(2)) : 1
    const accepted = Number.isFinite(weight) && weight > 0
    if (name === 'gzip' || name === 'x-gzip') return accepted
    if (name === '*') star = accepted
  }
  return star ?? false
}

/**
 * Answers with JSON text as it is, gzipped (level 1: fast, and JSON of repeated keys shrinks
 * tenfold anyway) when the client takes gzip and the text is large. For what screens fetch
 * often and big — the board of a whole field is some 400 KB — where sending fewer bytes saves
 * more time than the compression costs. A reverse proxy in front may compress as well; it
 * leaves an encoded answer as it is.
 */
export async function sendJsonText(event: H3Event, text: string): Promise<string | Buffer> {
  setResponseHeader(event, 'content-type', 'application/json')
  appendResponseHeader(event, 'vary', 'accept-encoding')
  if (text.length < GZIP_MIN_BYTES || !acceptsGzip(getRequestHeader(event, 'accept-encoding'))) return text
  setResponseHeader(event, 'content-encoding', 'gzip')
  return gzipAsync(text, { level: 1 })
}

/** What is worth gzipping when a handler answers: pages, JSON, CSV and plain text. */
const TEXT_TYPES = /^(?:text\/(?:html|csv|plain)|application\/json)\b/i

/** Below this, an answer goes as it is: the gzip header and the work would cost more than they save. */
export const GZIP_MIN_ANSWER_BYTES = 1024

/** A handler's answer that h3 sends as JSON text: not a web Response, a stream, bytes, a file or an error. */
function jsonValue(body: unknown): boolean {
  const t = typeof body
  if (t === 'boolean' || t === 'number') return true
  if (t !== 'object' || body === null) return false
  const o = body as Record<string, unknown>
  return !(body instanceof Error) && !o.buffer && typeof o.pipe !== 'function' && typeof o.getReader !== 'function'
    && typeof o.arrayBuffer !== 'function' && typeof o.end !== 'function' && !(body instanceof Response)
}

/**
 * An answer as sent, gzipped (zlib's default level) when the client takes gzip and the answer is
 * a page's HTML, JSON, CSV or plain text of at least GZIP_MIN_ANSWER_BYTES: a page's HTML goes
 * to a phone on a weak signal at a third to a quarter of its size, the day's pack at a fifth.
 * Undefined to send the body as it is: bytes and streams (files, PDFs, images), an answer
 * encoded already (the board's snapshot, `sendJsonText`), a small one, a client that does not
 * take gzip, or the error page as the framework's error handler fetches it in-process (it
 * reads the text and sends it on itself, with the visitor's own headers copied into its
 * request).
 */
export async function gzippedAnswer(event: H3Event, body: unknown): Promise<Buffer | undefined> {
  const res = event.node.res
  if (res.headersSent || res.getHeader('content-encoding')) return undefined
  // The error page rendered for the server's own error handler, which reads it as text.
  if (getRequestHeader(event, 'x-nuxt-error')) return undefined
  const status = res.statusCode
  if (status === 204 || status === 304 || event.method === 'HEAD') return undefined
  const isText = typeof body === 'string'
  if (!isText && !jsonValue(body)) return undefined
  // As h3 sends them: a string as HTML, any other value as JSON, unless the handler said otherwise.
  const type = String(res.getHeader('content-type') ?? (isText ? 'text/html' : 'application/json'))
  if (!TEXT_TYPES.test(type)) return undefined
  appendResponseHeader(event, 'vary', 'accept-encoding')
  // A client that does not take gzip: h3 serialises the value itself, once.
  if (!acceptsGzip(getRequestHeader(event, 'accept-encoding'))) return undefined
  const text = isText ? body as string : JSON.stringify(body)
  if (Buffer.byteLength(text) < GZIP_MIN_ANSWER_BYTES) return undefined
  const zipped = await gzipAsync(text)
  if (!res.getHeader('content-type')) setResponseHeader(event, 'content-type', isText ? 'text/html;charset=utf-8' : 'application/json')
  setResponseHeader(event, 'content-encoding', 'gzip')
  return zipped
}

