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
