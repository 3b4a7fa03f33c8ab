// Validation of bodies, queries and route params against the shared zod schemas, answering
// 400 with per-field messages (see errors.ts). Every body is read here, with its size limit
// enforced while it streams, and no text of a request reaches the database with a control
// character in it.
import type { IncomingMessage } from 'node:http'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from './errors'

/** The most a JSON body may hold: far above any form of the app. */
export const JSON_BODY_MAX_BYTES = 1024 * 1024

const RAW_BODY = Symbol.for('h3RawBody') // where h3's readRawBody keeps (and looks for) the body

/**
 * Reads the request's body, at most `maxBytes` of it: a declared larger Content-Length is
 * refused before a byte is read, and a chunked body as soon as it passes the limit (the rest
 * is drained unread, so memory holds `maxBytes` at most). 413 with `tooLarge`. h3's own
 * readers (readBody, readRawBody, readMultipartFormData) then reuse what was read. Undefined
 * when the request has no body.
 */
export function readLimitedBody(event: H3Event, maxBytes: number, tooLarge: string): Promise<Buffer | undefined> {
  const req = event.node.req as IncomingMessage & { [RAW_BODY]?: Promise<Buffer> }
  if (req[RAW_BODY]) return req[RAW_BODY]
  const declared = Number.parseInt(req.headers['content-length'] ?? '', 10)
  const chunked = /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
  if (!declared && !chunked) return Promise.resolve(undefined)
  if (declared > maxBytes) return Promise.reject(httpError(413, tooLarge))
  const body = new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    let refused = false
    req.on('error', reject)
    req.on('data', (chunk: Buffer) => {
      if (refused) return
      size += chunk.length
      if (size > maxBytes) {
        refused = true
        chunks.length = 0
        reject(httpError(413, tooLarge))
        return
      }
      chunks.push(chunk)
    })
    req.on('end', () => {
      if (!refused) resolve(Buffer.concat(chunks))
    })
  })
  req[RAW_BODY] = body
  return body
}

// C0 controls but tab, line feed and carriage return (CRLF line breaks of pasted text and
// CSV files are harmless), DEL, and the C1 controls. NUL is what PostgreSQL refuses outright.
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/

/** Whether a text holds a control character that is not a tab or a line break. */
export function hasControlCharacter(text: string): boolean {
  return CONTROL.test(text)
}

/** The path (`units.0.note`) of the first string, or key, holding a control character. */
export function controlCharacterPath(value: unknown, path: (string | number)[] = []): (string | number)[] | undefined {
  if (typeof value === 'string') return hasControlCharacter(value) ? path : undefined
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = controlCharacterPath(value[i], [...path, i])
      if (found) return found
    }
    return undefined
  }
  if (value && typeof value === 'object') {
    for (const [key, inner] of Object.entries(value)) {
      if (hasControlCharacter(key)) return [...path, key]
      const found = controlCharacterPath(inner, [...path, key])
      if (found) return found
    }
  }
  return undefined
}

/** 400 naming the field (a form shows it beside the field), when any text holds a control character. */
export function assertPlainText(value: unknown): void {
  const path = controlCharacterPath(value)
  if (path) throw controlCharacterError(path)
}

/** The 400 for a control character at `path` (its first part is the form's field). */
export function controlCharacterError(path: (string | number)[]) {
  const field = path.length ? String(path[0]) : ''
  const name = path.length ? path.join('.') : 'body'
  return httpError(400, MESSAGES.controlCharacterIn(name), {
    fieldErrors: field ? { [field]: [MESSAGES.controlCharacter] } : {},
    formErrors: field ? [] : [MESSAGES.controlCharacter],
  })
}

/** The JSON body, limited to `maxBytes` (1 MB unless said) and free of control characters, parsed by `schema`. */
export async function validBody<S extends z.ZodType>(event: H3Event, schema: S, options: { maxBytes?: number, tooLarge?: string } = {}): Promise<z.output<S>> {
  await readLimitedBody(event, options.maxBytes ?? JSON_BODY_MAX_BYTES, options.tooLarge ?? MESSAGES.bodyTooLarge)
  const body: unknown = await readBody(event, { strict: true })
  assertPlainText(body)
  // A ZodError is mapped to field messages by errors.ts.
  return schema.parse(body)
}

export async function validQuery<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const query: unknown = getQuery(event)
  assertPlainText(query)
  return schema.parse(query)
}

/** A malformed id in the address names nothing, so it answers 404 rather than 400. */
export async function validParams<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const params = getRouterParams(event, { decode: true })
  if (controlCharacterPath(params)) throw httpError(404, MESSAGES.notFound)
  const result = schema.safeParse(params)
  if (!result.success) throw httpError(404, MESSAGES.notFound)
  return result.data
}
