// Validation of bodies, queries and route params against the shared zod schemas, answering
// 400 with per-field messages (see errors.ts).
import type { H3Event } from 'h3'
import type { z } from 'zod'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from './errors'

// h3 wraps the ZodError a failed parse throws in a 400; errors.ts turns it into field messages.

export function validBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return readValidatedBody(event, body => schema.parse(body))
}

export function validQuery<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return getValidatedQuery(event, query => schema.parse(query))
}

/** A malformed id in the address names nothing, so it answers 404 rather than 400. */
export async function validParams<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const result = schema.safeParse(getRouterParams(event, { decode: true }))
  if (!result.success) throw httpError(404, MESSAGES.notFound)
  return result.data
}
