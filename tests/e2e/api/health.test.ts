// The operators' contract: health reflects the database, the app survives its outage,
// and sessions survive a restart of the app.
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../support/api'
import { startServer } from '../../support/server'
import { clusterFromEnv, startCluster, stopCluster } from '../../../scripts/lib/postgres'

const baseUrl = inject('baseUrl')

async function healthWithin(ms: number, status: number) {
  const deadline = Date.now() + ms
  let last: Response | undefined
  while (Date.now() < deadline) {
    last = await fetch(`${baseUrl}/api/health`)
    if (last.status === status) return last
    await new Promise(r => setTimeout(r, 200))
  }
  return last!
}

describe('GET /api/health', () => {
  it('answers 200 ok while the database is up', async () => {
    const res = await fetch(`${baseUrl}/api/health`)
    expect(res.status).toBe(200)
    expect(await res.json()).toEqual({ status: 'ok', db: 'ok' })
  })

  it('answers 503 while PostgreSQL is stopped, and 200 again once it is back', async () => {
    const cluster = clusterFromEnv()
    const { client } = await signedUpClient(baseUrl)
    await stopCluster(cluster)
    try {
      const down = await healthWithin(10_000, 503)
      expect(down.status).toBe(503)
      expect(await down.json()).toEqual({ status: 'degraded', db: 'down' })
      // Other routes say so in words, and the server keeps running.
      const me = await client.get('/api/me')
      expect(me.status).toBe(503)
      expect(me.body.message).toMatch(/database is not reachable/)
    }
    finally {
      await startCluster(cluster)
    }
    const up = await healthWithin(15_000, 200)
    expect(await up.json()).toEqual({ status: 'ok', db: 'ok' })
    expect((await client.get('/api/me')).status).toBe(200)
  }, 60_000)
})

describe('sessions across a restart', () => {
  let server: Awaited<ReturnType<typeof startServer>> | undefined
  afterAll(async () => { await server?.stop() })

  it('keeps a signed-in user signed in after the server restarts', async () => {
    server = await startServer()
    const { client } = await signedUpClient(server.url)
    const port = server.port
    await server.stop()
    server = await startServer({}, port)
    const again = new ApiClient(server.url)
    again.cookie = client.cookie
    const me = await again.get('/api/me')
    expect(me.status).toBe(200)
  }, 60_000)
})
