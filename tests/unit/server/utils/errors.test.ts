import { describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { createError } from 'h3'
import { toHttpError } from '../../../../server/utils/errors'

describe('toHttpError', () => {
  it('turns a zod error into 400 with per-field messages', () => {
    const schema = z.object({ name: z.string({ error: 'Enter a name.' }) })
    const err = toHttpError(schema.safeParse({}).error)
    expect(err.statusCode).toBe(400)
    expect(err.data).toEqual({ fieldErrors: { name: ['Enter a name.'] }, formErrors: [] })
  })

  it('unwraps the zod error h3 puts inside its validation error', () => {
    const zodError = z.object({ n: z.number({ error: 'A number.' }) }).safeParse({ n: 'x' }).error
    const err = toHttpError(createError({ statusCode: 400, statusMessage: 'Validation Error', data: zodError }))
    expect(err.data).toEqual({ fieldErrors: { n: ['A number.'] }, formErrors: [] })
  })

  it('maps a unique violation to 409 and a missing reference to 409', () => {
    expect(toHttpError(Object.assign(new Error('dup'), { code: '23505' })).statusCode).toBe(409)
    expect(toHttpError(Object.assign(new Error('fk'), { code: '23503' })).statusCode).toBe(409)
  })

  it('maps malformed values the database rejects to 400', () => {
    expect(toHttpError(Object.assign(new Error('bad uuid'), { code: '22P02' })).statusCode).toBe(400)
  })

  it('maps an unreachable database to 503', () => {
    expect(toHttpError(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5'), { code: 'ECONNREFUSED' })).statusCode).toBe(503)
    expect(toHttpError(Object.assign(new Error('Knex: Timeout acquiring a connection'), { name: 'KnexTimeoutError' })).statusCode).toBe(503)
    expect(toHttpError(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })])).statusCode).toBe(503)
  })

  it('gives a plain 500 without internals for anything else', () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => {})
    const err = toHttpError(new Error('secret internals'))
    expect(log).toHaveBeenCalledOnce()
    log.mockRestore()
    expect(err.statusCode).toBe(500)
    expect(err.message).not.toContain('secret')
  })

  it('keeps a deliberate HTTP error as it is', () => {
    const original = createError({ statusCode: 403, message: 'No.' })
    expect(toHttpError(original)).toBe(original)
  })
})
