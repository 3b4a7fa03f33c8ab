// One mapper from whatever a handler throws to an answer a person understands: zod issues
// → 400 with per-field messages, database constraint errors → 404/409, a busy database (full
// pool, lock or statement timeout, deadlock) → 503 with Retry-After, an unreachable database
// → 503. Anything else is logged and becomes a plain 500. A 5xx says "nothing was changed"
// only when it is certain: no statement that could write was committed during the request.
import { AsyncLocalStorage } from 'node:async_hooks'
import { z } from 'zod'
import { H3Error, createError, defineEventHandler, setResponseHeader, type H3Event, type EventHandlerRequest } from 'h3'
import { MESSAGES } from '#shared/constants/messages'

/** Seconds a client is asked to wait after a 503 for a busy database. */
export const BUSY_RETRY_AFTER_SECONDS = 5

/**
 * What one request has sent to the database, as far as it could have changed anything: a
 * writing statement outside a transaction, or the COMMIT of a transaction that wrote. A
 * transaction never committed changed nothing, whatever it wrote.
 */
interface RequestWrites {
  changed: boolean
  /** Connections (knex's ids) whose open transaction has written. */
  dirty: Set<string>
}

const requestWrites = new AsyncLocalStorage<RequestWrites>()

// A statement that may write: any of these words, outside a name (updated_at is not "update").
// Reads that lock rows (FOR UPDATE) count too: the rule only has to err on the safe side.
const WRITING = /\b(insert|update|delete|truncate|merge|alter|create|drop|grant|revoke|copy|call|do|lock|refresh|reindex|vacuum)\b/i

/** Knex's 'query' event (server/utils/db.ts): notes what the current request may have changed. */
export function noteStatement(query: { sql?: string, __knexUid?: string, __knexTxId?: string }): void {
  const writes = requestWrites.getStore()
  if (!writes || writes.changed) return
  const sql = (query.sql ?? '').trim()
  const connection = query.__knexUid ?? ''
  if (/^commit\b/i.test(sql)) {
    if (writes.dirty.has(connection)) writes.changed = true
  }
  else if (/^rollback;?$/i.test(sql)) {
    writes.dirty.delete(connection)
  }
  else if (WRITING.test(sql)) {
    if (query.__knexTxId) writes.dirty.add(connection)
    else writes.changed = true
  }
}

/** Runs a request's work with a fresh record of what it sends to the database. */
export function trackRequestWrites<T>(work: () => T): T {
  return requestWrites.run({ changed: false, dirty: new Set() }, work)
}

/** Whether the current request may have changed anything in the database (true outside a request). */
export function mayHaveChanged(): boolean {
  return requestWrites.getStore()?.changed ?? true
}

const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08006'])

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request', 401: 'Unauthorized', 403: 'Forbidden', 404: 'Not Found', 409: 'Conflict',
  413: 'Payload Too Large', 415: 'Unsupported Media Type', 422: 'Unprocessable Content',
  429: 'Too Many Requests', 500: 'Internal Server Error', 503: 'Service Unavailable',
}

/** An error answer with its proper status text and a message for a person. */
export function httpError(statusCode: number, message: string, data?: Record<string, unknown>): H3Error {
  return createError({ statusCode, statusMessage: STATUS_TEXT[statusCode] ?? 'Error', message, data })
}

/** A 400 with one field's message, shaped like a zod failure so forms show it beside the field. */
export function fieldError(field: string, message: string): H3Error {
  return httpError(400, `${MESSAGES.invalidInput} ${message}`, { fieldErrors: { [field]: [message] }, formErrors: [] })
}

export function validationError(error: z.ZodError): H3Error {
  const { fieldErrors, formErrors } = z.flattenError(error)
  const firstField = Object.values(fieldErrors).flat()[0] as string | undefined
  return httpError(
    400,
    formErrors[0] ?? (firstField ? `${MESSAGES.invalidInput} ${firstField}` : MESSAGES.invalidInput),
    { fieldErrors, formErrors },
  )
}

function isDatabaseDown(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false
  const e = err as { code?: string, name?: string, message?: string, errors?: unknown[] }
  if (e.code && DB_DOWN_CODES.has(e.code)) return true
  if (Array.isArray(e.errors) && e.errors.some(isDatabaseDown)) return true // AggregateError from net
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect/i.test(e.message ?? '')
}

/**
 * The database is there but cannot serve this request now: no connection free in the pool,
 * a lock or a statement that took too long (lock_timeout, statement_timeout), a deadlock or a
 * serialisation failure. Trying again shortly is the cure.
 */
export function isDatabaseBusy(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false
  const e = err as { code?: string, name?: string }
  return e.name === 'KnexTimeoutError' || ['55P03', '57014', '40P01', '40001'].includes(e.code ?? '')
}

export function toHttpError(err: unknown): H3Error {
  if (err instanceof H3Error) {
    // h3's getValidated*/readValidated* wrap the schema's ZodError; unwrap it into field messages.
    if (err.data instanceof z.ZodError) return validationError(err.data)
    // h3 answers a malformed JSON body with a terse message; say it plainly.
    if (err.statusCode === 400 && /Invalid JSON body/i.test(err.message)) return httpError(400, MESSAGES.invalidJson)
    return err
  }
  if (err instanceof z.ZodError) return validationError(err)
  const code = (err as { code?: string } | null)?.code
  if (code === '23505') return httpError(409, MESSAGES.conflict)
  if (code === '23503') return httpError(409, MESSAGES.referenceMissing)
  if (code === '22P02' || code === '22007' || code === '22008') {
    return httpError(400, MESSAGES.invalidInput)
  }
  const certain = !mayHaveChanged()
  if (isDatabaseBusy(err)) return httpError(503, certain ? MESSAGES.serverBusy : MESSAGES.serverBusyUncertain, { retryAfter: BUSY_RETRY_AFTER_SECONDS })
  if (isDatabaseDown(err)) return httpError(503, certain ? MESSAGES.databaseDown : MESSAGES.databaseDownUncertain, { retryAfter: BUSY_RETRY_AFTER_SECONDS })
  console.error('[gridmark] unexpected error', err)
  return httpError(500, certain ? MESSAGES.unexpected : MESSAGES.unexpectedUncertain)
}

/**
 * Every API route is defined through this wrapper so that a failure of any kind leaves as
 * one of our mapped answers, never as a bare stack trace.
 */
export function defineApiHandler<T>(handler: (event: H3Event<EventHandlerRequest>) => Promise<T> | T) {
  return defineEventHandler(event => trackRequestWrites(async () => {
    try {
      return await handler(event)
    }
    catch (err) {
      const answer = toHttpError(err)
      const retryAfter = (answer.data as { retryAfter?: number } | undefined)?.retryAfter
      if (answer.statusCode === 503 && retryAfter) setResponseHeader(event, 'Retry-After', retryAfter)
      throw answer
    }
  }))
}
