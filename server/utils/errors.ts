// One mapper from whatever a handler throws to an answer a person understands: zod issues
// → 400 with per-field messages, database constraint errors → 404/409, an unreachable
// database → 503. Anything else is logged and becomes a plain 500.
import { z } from 'zod'
import { H3Error, createError, defineEventHandler, type H3Event, type EventHandlerRequest } from 'h3'
import { MESSAGES } from '#shared/constants/messages'

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
  if (e.name === 'KnexTimeoutError') return true
  if (Array.isArray(e.errors) && e.errors.some(isDatabaseDown)) return true // AggregateError from net
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect/i.test(e.message ?? '')
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
  if (isDatabaseDown(err)) return httpError(503, MESSAGES.databaseDown)
  console.error('[gridmark] unexpected error', err)
  return httpError(500, MESSAGES.unexpected)
}

/**
 * Every API route is defined through this wrapper so that a failure of any kind leaves as
 * one of our mapped answers, never as a bare stack trace.
 */
export function defineApiHandler<T>(handler: (event: H3Event<EventHandlerRequest>) => Promise<T> | T) {
  return defineEventHandler(async (event) => {
    try {
      return await handler(event)
    }
    catch (err) {
      throw toHttpError(err)
    }
  })
}
