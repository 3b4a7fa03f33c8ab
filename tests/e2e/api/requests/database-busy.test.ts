// A busy database answers 503 "busy, try again" with Retry-After, and says nothing was changed
// only when that is certain. A server of its own with one pooled connection and short waits:
// the test holds a row lock that the server's one connection queues on (lock_timeout ends the
// wait), and a second request meanwhile finds the pool full (the acquire timeout ends that).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MESSAGES } from '../../../../shared/constants/messages'
import { ApiClient, GOOD_PASSWORD, randomAddress, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { startServer, type RunningServer } from '../../../support/server'

let server: RunningServer
beforeAll(async () => {
  server = await startServer({
    GRIDMARK_DB_POOL_MAX: '1',
    GRIDMARK_DB_ACQUIRE_TIMEOUT_MS: '300',
    GRIDMARK_DB_LOCK_TIMEOUT_MS: '3000',
    NUXT_MAIL_WORKER_INTERVAL_MS: '3600000',
    NUXT_REMINDERS_INTERVAL_MS: '0',
  })
}, 40_000)
afterAll(async () => {
  await server?.stop()
  await closeTestDb()
})
inject('baseUrl') // the shared server is not used here; its database is

const signUp = (address: string) =>
  new ApiClient(server.url, address).post('/api/auth/signup', { email: uniqueEmail('busy'), name: 'Busy Pilot', password: GOOD_PASSWORD })

describe('a busy database', () => {
  it('answers 503 with Retry-After to a request that waited too long for a lock, and to one that found the pool full', async () => {
    const address = randomAddress()
    const trx = await testDb().transaction()
    try {
      // The sign-up counter of this address, inserted and not committed: the server's upsert of it waits.
      const { rows: [{ pid }] } = await trx.raw('select pg_backend_pid() as pid')
      await trx('rate_limits').insert({ key: `signup-address:${address}`, points: 0, expire: Date.now() + 3_600_000 })
      const held = signUp(address)
      await expect.poll(async () => {
        const { rows } = await testDb().raw('select count(*)::int as n from pg_stat_activity where ? = any(pg_blocking_pids(pid))', [pid])
        return rows[0].n
      }, { timeout: 2500, interval: 20 }).toBe(1)

      // The one connection is taken: the next request cannot have one.
      const full = await signUp(randomAddress())
      expect(full.status).toBe(503)
      expect(full.headers.get('retry-after')).toBe('5')
      expect(full.body.message).toBe(MESSAGES.serverBusy)

      // The waiting one gives up at the lock timeout; the counter's upsert was its only statement.
      const timedOut = await held
      expect(timedOut.status).toBe(503)
      expect(timedOut.headers.get('retry-after')).toBe('5')
      expect(timedOut.body.message).toBe(MESSAGES.serverBusy)
    }
    finally {
      await trx.rollback()
    }
    // The lock gone, the server serves again.
    expect((await signUp(address)).status).toBe(202)
  })
})
