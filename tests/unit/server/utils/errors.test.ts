import { describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { createError } from 'h3'
import { noteStatement, toHttpError, trackRequestWrites } from '../../../../server/utils/errors'
import { MESSAGES } from '../../../../shared/constants/messages'

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
    expect(toHttpError(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })])).statusCode).toBe(503)
  })

  it('maps a full pool, a lock or statement timeout and a deadlock to 503 "busy" with a time to retry', () => {
    const busy = [
      Object.assign(new Error('Knex: Timeout acquiring a connection. The pool is probably full.'), { name: 'KnexTimeoutError' }),
      Object.assign(new Error('canceling statement due to lock timeout'), { code: '55P03' }),
      Object.assign(new Error('canceling statement due to statement timeout'), { code: '57014' }),
      Object.assign(new Error('deadlock detected'), { code: '40P01' }),
    ]
    for (const err of busy) {
      const answer = trackRequestWrites(() => toHttpError(err))
      expect(answer.statusCode).toBe(503)
      expect(answer.message).toBe(MESSAGES.serverBusy)
      expect(answer.data).toEqual({ retryAfter: 5 })
    }
  })

  it('says "nothing was changed" only when no write was committed during the request', () => {
    const busy = Object.assign(new Error('lock timeout'), { code: '55P03' })
    const down = Object.assign(new Error('Connection terminated unexpectedly'), { code: 'ECONNRESET' })
    const message = (statements: Parameters<typeof noteStatement>[0][], err: Error) => trackRequestWrites(() => {
      statements.forEach(noteStatement)
      return toHttpError(err).message
    })
    // Reads only, or a transaction that wrote but never committed.
    expect(message([{ sql: 'select "updated_at", "deleted_by" from "entries" where "id" = ?' }], busy)).toBe(MESSAGES.serverBusy)
    expect(message([
      { sql: 'BEGIN;', __knexUid: 'c1', __knexTxId: 't1' },
      { sql: 'insert into "audit_log" ("action") values (?)', __knexUid: 'c1', __knexTxId: 't1' },
      { sql: 'ROLLBACK', __knexUid: 'c1', __knexTxId: 't1' },
    ], down)).toBe(MESSAGES.databaseDown)
    // A write outside a transaction, or a COMMIT of one that wrote (its outcome unknown when the line broke).
    expect(message([{ sql: 'update "users" set "name" = ?' }], busy)).toBe(MESSAGES.serverBusyUncertain)
    expect(message([
      { sql: 'insert into "grid_checks" ("id") values (?)', __knexUid: 'c1', __knexTxId: 't1' },
      { sql: 'COMMIT;', __knexUid: 'c1', __knexTxId: 't1' },
    ], down)).toBe(MESSAGES.databaseDownUncertain)
    // A read-only transaction committed changed nothing.
    expect(message([
      { sql: 'select 1', __knexUid: 'c2', __knexTxId: 't2' },
      { sql: 'COMMIT;', __knexUid: 'c2', __knexTxId: 't2' },
    ], busy)).toBe(MESSAGES.serverBusy)
  })

  it('gives a plain 500 without internals for anything else', () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => {})
    const err = trackRequestWrites(() => toHttpError(new Error('secret internals')))
    expect(log).toHaveBeenCalledOnce()
    log.mockRestore()
    expect(err.statusCode).toBe(500)
    expect(err.message).toBe(MESSAGES.unexpected)
    expect(err.message).not.toContain('secret')
  })

  it('keeps a deliberate HTTP error as it is', () => {
    const original = createError({ statusCode: 403, message: 'No.' })
    expect(toHttpError(original)).toBe(original)
  })
})
