// A server without an SMTP URL says so once and keeps mail queued rather than failing.
import { afterAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../../../support/server'

let server: RunningServer | undefined
afterAll(async () => {
  await server?.stop()
})

describe('mail worker without SMTP', () => {
  it('warns once and never claims mail', async () => {
    // This second server shares the test database, so it must not take the main server's mail:
    // with no SMTP URL it does not even look at the outbox.
    server = await startServer({ NUXT_SMTP_URL: '', NUXT_MAIL_WORKER_INTERVAL_MS: '100', NUXT_REMINDERS_INTERVAL_MS: '0' })
    const warnings = () => server!.output().match(/no SMTP URL configured/g) ?? []
    await expect.poll(() => warnings().length, { timeout: 10_000 }).toBeGreaterThan(0)
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
    // Over the server's whole life, to its end: one warning.
    await server.stop()
    expect(warnings()).toHaveLength(1)
  })
})
