/* eslint-disable @typescript-eslint/no-explicit-any -- pushed events are what the tests assert */
// Several app instances on one PostgreSQL share board events through the PostgreSQL adapter:
// a check submitted on one reaches a board connected to another, also after PostgreSQL
// restarts. A restart of the app loses no acknowledged grid check or director action, and a
// board's socket reconnects by itself and finds them in the snapshot.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../../../support/api'
import { closeTestDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { boardSocket, joinBoard, openToday, type BoardSocket } from '../../../support/board'
import { startServer, type RunningServer } from '../../../support/server'
import { clusterFromEnv, startCluster, stopCluster } from '../../../../scripts/lib/postgres'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
const servers: RunningServer[] = []
const sockets: BoardSocket[] = []
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Two Instances Cup')
  entryId = await gridEntry(w, { compId: 'I1' })
  await openToday(w)
})
afterAll(async () => {
  for (const s of sockets) s.close()
  for (const s of servers) await s.stop()
  await closeTestDb()
})

/** The same signed-in client, speaking to another instance. */
function on(url: string, client: ApiClient): ApiClient {
  const c = new ApiClient(url, client.address)
  c.cookie = client.cookie
  return c
}

async function healthy(url: string, ms = 20_000) {
  const deadline = Date.now() + ms
  while (Date.now() < deadline) {
    try {
      if ((await fetch(`${url}/api/health`)).status === 200) return
    }
    catch { /* restarting */ }
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`${url} did not become healthy`)
}

describe('two instances on one PostgreSQL', () => {
  let second: RunningServer
  let board: BoardSocket
  beforeAll(async () => {
    second = await startServer()
    servers.push(second)
    board = await boardSocket(second.url, w.director.client)
    sockets.push(board)
    expect(await joinBoard(board, w.competitionId)).toEqual({ ok: true, scope: 'staff' })
  })

  it('a check submitted on one instance reaches a board connected to the other', async () => {
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
    expect(res.status).toBe(201)
    const event = await board.next('board:tile', e => e.entryId === entryId && e.cause === 'grid-check', 10_000)
    expect(event.tile).toMatchObject({ readiness: 'ready', lastCheck: { initials: 'SS' } })
  })

  it('and so does a director’s action made on the other instance', async () => {
    const local = await boardSocket(baseUrl, w.organiser.client)
    sockets.push(local)
    await joinBoard(local, w.competitionId)
    const res = await on(second.url, w.director.client).post(`${w.base}/entries/${entryId}/hold`, { reason: 'Wing pins not secured' })
    expect(res.status).toBe(201)
    const event = await local.next('board:tile', e => e.entryId === entryId && e.cause === 'hold', 10_000)
    expect(event.tile.hold.reason).toBe('Wing pins not secured')
  })

  // Three restarts: each drops the adapter's LISTEN connection, and its pool holds three. A
  // dropped connection never given back would leave none to listen on by the third.
  it('still shares events after PostgreSQL restarts, three times over', async () => {
    const cluster = clusterFromEnv()
    for (let restart = 1; restart <= 3; restart++) {
      await stopCluster(cluster)
      await startCluster(cluster)
      await Promise.all([healthy(baseUrl), healthy(second.url)])
      // The adapter listens again within a few seconds; retry until a new check crosses over.
      const deadline = Date.now() + 20_000
      let crossed = false
      while (!crossed && Date.now() < deadline) {
        const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
        if (res.status !== 201) {
          await new Promise(r => setTimeout(r, 500))
          continue
        }
        crossed = await board.next('board:tile', e => e.entryId === entryId && e.tile.lastCheck?.at === res.body.gridCheck.checkedAt, 2000).then(() => true, () => false)
      }
      expect(crossed, `after restart ${restart}`).toBe(true)
    }
  }, 150_000)
})

describe('a restart of the app', () => {
  it('keeps every acknowledged check and action; the board reconnects by itself and finds them', async () => {
    const own = await startServer()
    servers.push(own)
    const director = on(own.url, w.director.client)
    const s = await boardSocket(own.url, w.director.client, { reconnection: true })
    sockets.push(s)
    await joinBoard(s, w.competitionId)

    const check = await on(own.url, w.scrutineer.client).post(`${w.base}/grid-checks`, checkBody(entryId, { answers: [{ itemId: 'ballast', result: 'fail', note: 'Tail ballast missing' }] }))
    expect(check.status).toBe(201)
    const release = await director.post(`${w.base}/entries/${entryId}/release`, { reason: 'Pins secured' })
    expect(release.status).toBe(201)

    const port = own.port
    const reconnected = new Promise(resolve => s.socket.io.once('reconnect', resolve))
    await own.stop()
    servers.splice(servers.indexOf(own), 1)
    const again = await startServer({}, port)
    servers.push(again)
    await reconnected
    expect(await joinBoard(s, w.competitionId)).toEqual({ ok: true, scope: 'staff' })

    const snap = (await director.get(`${w.base}/board`)).body
    const tile = snap.tiles.find((t: any) => t.entryId === entryId)
    expect(tile).toMatchObject({ readiness: 'held', hold: null, headline: { kind: 'checklist', text: 'Failed on the grid: Ballast as declared' } })
    expect(tile.lastCheck.at).toBe(check.body.gridCheck.checkedAt)
    // Pushes flow again on the reconnected socket.
    expect((await director.post(`${w.base}/entries/${entryId}/hold`, { reason: 'Check the ballast again' })).status).toBe(201)
    await s.next('board:tile', e => e.cause === 'hold' && e.tile.hold?.reason === 'Check the ballast again', 10_000)
  }, 90_000)
})
