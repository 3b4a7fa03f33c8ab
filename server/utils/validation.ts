// Validation of bodies, queries and route params against the shared zod schemas, answering
// 400 with per-field messages (see errors.ts).
import type { H3Event } from 'h3'
import type { z } from 'zod'

// h3 wraps the ZodError a failed parse throws in a 400; errors.ts turns it into field messages.

export function validBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return readValidatedBody(event, body => schema.parse(body))
}

export function validQuery<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return getValidatedQuery(event, query => schema.parse(query))
}

export function validParams<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return getValidatedRouterParams(event, params => schema.parse(params))
}
