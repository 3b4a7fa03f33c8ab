// Every connection of the server carries a statement and a lock timeout; migrations none.
import { afterEach, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../knexfile'

const saved = { ...process.env }
afterEach(() => {
  process.env = { ...saved }
})

const connectionOf = (config: ReturnType<typeof createKnexConfig>) => config.connection as Record<string, unknown>

describe('the database connections', () => {
  it('carry a 30 s statement timeout and a 10 s lock timeout unless told otherwise', () => {
    delete process.env.GRIDMARK_DB_STATEMENT_TIMEOUT_MS
    delete process.env.GRIDMARK_DB_LOCK_TIMEOUT_MS
    const config = createKnexConfig('postgres://app@127.0.0.1:5432/x')
    expect(connectionOf(config)).toMatchObject({ statement_timeout: 30_000, lock_timeout: 10_000 })
    expect(config.acquireConnectionTimeout).toBe(4000)
  })

  it('take their limits from the environment', () => {
    process.env.GRIDMARK_DB_STATEMENT_TIMEOUT_MS = '5000'
    process.env.GRIDMARK_DB_LOCK_TIMEOUT_MS = '0'
    process.env.GRIDMARK_DB_ACQUIRE_TIMEOUT_MS = '1500'
    process.env.GRIDMARK_DB_POOL_MAX = '3'
    const config = createKnexConfig('postgres://app@127.0.0.1:5432/x')
    expect(connectionOf(config)).toMatchObject({ statement_timeout: 5000, lock_timeout: 0 })
    expect(config.acquireConnectionTimeout).toBe(1500)
    expect(config.pool).toMatchObject({ max: 3 })
  })

  it('leave them out for migrations and scripts', () => {
    const connection = connectionOf(createKnexConfig('postgres://app@127.0.0.1:5432/x', { timeouts: false }))
    expect(connection).not.toHaveProperty('statement_timeout')
    expect(connection).not.toHaveProperty('lock_timeout')
  })
})
