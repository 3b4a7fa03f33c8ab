/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// A grid check on an open day brings its entry's tile along, in the check's own transaction:
// the board (GET …/board) and the pushed tile show the check with the readiness it gave; a
// weigh-in over the limit holds the tile; the board of the day asked for by date is the same
// board. When the whole day is brought up to date after a change every dossier reads, the
// tiles the checks wrote stay as they are (no new number, nothing pushed again).
import { io, type Socket } from 'socket.io-client'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, todayIn, type GridWorld } from '../../../support/grid'

const baseUrl = inject('baseUrl')

let w: GridWorld
const ids: string[] = []
let socket: Socket
const pushed: any[] = []
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Grid Tile Cup')
  for (let i = 0; i < 3; i++) ids.push(await gridEntry(w))
  const opened = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
  expect(opened.status).toBe(201)
  socket = io(baseUrl, { transports: ['websocket'], extraHeaders: { cookie: w.director.client.cookie }, reconnection: false })
  socket.on('board:tile', (e: any) => pushed.push(e))
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', resolve)
    socket.once('connect_error', reject)
  })
  expect(await socket.emitWithAck('board:join', { competitionId: w.competitionId })).toEqual({ ok: true, scope: 'staff' })
})
afterAll(async () => {
  socket?.disconnect()
  await closeTestDb()
})

const board = async (query = '') => {
  const res = await w.scrutineer.client.get(`${w.base}/board${query}`)
  expect(res.status).toBe(200)
  expect(res.headers.get('content-type')).toContain('application/json')
  return res.body
}
const tileOf = (b: any, id: string) => b.tiles.find((t: any) => t.entryId === id)

/** Waits for the pushed tile of this entry with a number above `after` (pushes follow the commit). */
async function pushedTile(entryId: string, after: number): Promise<any> {
  for (let i = 0; i < 100; i++) {
    const hit = pushed.find(e => e.entryId === entryId && e.seq > after)
    if (hit) return hit
    await new Promise(r => setTimeout(r, 50))
  }
  throw new Error(`no tile of ${entryId} was pushed after ${after}`)
}

describe('a grid check on an open day', () => {
  it('shows on the entry’s tile, with the readiness the check gave, on the board and pushed alike', async () => {
    const before = await board()
    expect(before.tiles).toHaveLength(3)
    expect(tileOf(before, ids[0]!)).toMatchObject({ readiness: 'unchecked', lastCheck: null })

    const body = checkBody(ids[0]!)
    const sentAt = performance.timeOrigin + performance.now()
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, body)
    const answeredAt = performance.timeOrigin + performance.now()
    expect(res.status).toBe(201)
    // Where its time went, step by step (the bench splits scan to board with it), and its
    // arrival on the server's wall clock, the same machine's as ours.
    const timing = res.headers.get('server-timing')!.split(', ').map(p => p.split(';'))
    expect(timing.map(([name]) => name)).toEqual(['auth', 'lock', 'write', 'commit', 'emit', 'push', 'start'])
    for (const [, dur] of timing.slice(0, -1)) expect(Number(dur!.replace('dur=', ''))).toBeGreaterThanOrEqual(0)
    const arrival = Number(timing.at(-1)![1]!.replace(/^desc="|"$/g, ''))
    expect(arrival).toBeGreaterThan(sentAt - 5)
    expect(arrival).toBeLessThan(answeredAt + 5)
    const after = await board()
    const tile = tileOf(after, ids[0]!)
    expect(tile).toMatchObject({
      entryId: ids[0], readiness: res.body.gridCheck.readiness, headline: null, counts: { blocking: 0, advisory: 0, waived: 0 },
      lastCheck: { at: body.checkedAt, initials: 'SS', name: 'Sam Scrutineer', outcome: 'pass' }, hold: null,
    })
    expect(tile.readiness).toBe('ready')
    expect(tile.seq).toBeGreaterThan(before.seq)
    expect(after.seq).toBe(tile.seq)
    expect(new Date(tile.updatedAt).toISOString()).toBe(tile.updatedAt)
    // The other tiles are as they were.
    for (const id of ids.slice(1)) expect(tileOf(after, id)).toEqual(tileOf(before, id))
    // What the board reads is what was pushed.
    const event = await pushedTile(ids[0]!, before.seq)
    expect(event).toMatchObject({ competitionId: w.competitionId, day: todayIn(), cause: 'grid-check', seq: tile.seq })
    expect(event.tile).toEqual(tile)
  })

  it('holds the tile when the check’s weigh-in is over the class limit', async () => {
    const before = await board()
    const weighIn = { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 498, arm: 0.1 }, { point: 'tail-wheel', weight: 34, arm: 4.5 }] }
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(ids[1]!, { weighIn }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.readiness).toBe('held')
    const blocking = res.body.gridCheck.findings.filter((f: any) => f.severity === 'blocking')
    expect(blocking.map((f: any) => f.checkId)).toContain('mass.class-limit')
    const tile = tileOf(await board(), ids[1]!)
    // The tile reads the same findings as the check: its headline is the check's first blocking one.
    expect(tile).toMatchObject({ readiness: 'held', headline: { kind: 'finding', checkId: blocking[0].checkId, severity: 'blocking' }, counts: { blocking: blocking.length } })
    expect((await pushedTile(ids[1]!, before.seq)).tile).toEqual(tile)
  })

  it('is on the board of the day asked for by date too', async () => {
    const open = await board()
    const byDate = await board(`?day=${todayIn()}`)
    expect({ ...byDate, generatedAt: null }).toEqual({ ...open, generatedAt: null })
    expect(open.day).toMatchObject({ day: todayIn(), kind: 'practice', status: 'open', openedBy: 'Dana Director', closedAt: null })
    expect(open.classes.map((c: any) => c.name).sort()).toEqual(['Club', 'Standard'])
  })
})

describe('the whole day brought up to date', () => {
  it('renumbers and pushes only the tile that changed, not the ones the checks wrote', async () => {
    const before = await board()
    const sent = pushed.length
    // A firmware expiring during the contest (1–7 May 2027) on the third glider, written behind
    // the app's back; then a change every dossier reads (a release added to the firmware
    // catalogue) brings the whole open day up to date.
    await testDb()('units').where({ entry_id: ids[2], kind: 'collision-warning' }).update({ firmware_expires_on: '2027-05-03' })
    expect((await w.organiser.client.post(`${w.base}/firmware`, { unitFamily: 'Tile Cup Family', version: '1.0', expiresOn: '2030-01-31' })).status).toBe(201)
    const changed = await pushedTile(ids[2]!, before.seq)
    expect(changed).toMatchObject({ cause: 'dossier' })
    expect(changed.tile.headline).toMatchObject({ kind: 'finding', checkId: 'firmware.valid-through-contest', severity: 'blocking' })
    const after = await board()
    expect(tileOf(after, ids[2]!)).toEqual(changed.tile)
    for (const id of ids.slice(0, 2)) expect(tileOf(after, id)).toEqual(tileOf(before, id))
    expect(pushed.slice(sent).map(e => e.entryId)).toEqual([ids[2]])
  })
})

describe('checks of one glider arriving out of order', () => {
  it('keep the later check on the tile when an earlier one arrives last, and change nothing on the board', async () => {
    const id = await gridEntry(w)
    const later = checkBody(id, { checkedAt: new Date(Date.now() - 60_000).toISOString() })
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, later)).status).toBe(201)
    const before = await board()
    const sent = pushed.length
    // Made ten minutes before, queued offline on another phone: a failed item.
    const earlier = checkBody(id, { checkedAt: new Date(Date.now() - 600_000).toISOString(), answers: [{ itemId: 'antennas', result: 'fail' }] })
    const res = await w.scrutineer2.client.post(`${w.base}/grid-checks`, earlier)
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.outcome).toBe('fail')
    const after = await board()
    expect(tileOf(after, id)).toEqual(tileOf(before, id))
    expect(tileOf(after, id)).toMatchObject({ readiness: 'ready', lastCheck: { at: later.checkedAt, outcome: 'pass', initials: 'SS' } })
    expect(after.seq).toBe(before.seq)
    // A later change is pushed and numbered next: no number was taken by the check that changed nothing.
    const next = checkBody(id)
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, next)).status).toBe(201)
    const event = await pushedTile(id, before.seq)
    expect(event.seq).toBe(before.seq + 1)
    expect(pushed.slice(sent).map(e => e.entryId)).toEqual([id])
  })

  it('show the one received last when two checks were made at the same instant', async () => {
    const id = await gridEntry(w)
    const at = new Date(Date.now() - 30_000).toISOString()
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id, { checkedAt: at }))).status).toBe(201)
    const second = await w.scrutineer2.client.post(`${w.base}/grid-checks`, checkBody(id, { checkedAt: at, answers: [{ itemId: 'antennas', result: 'fail' }] }))
    expect(second.status).toBe(201)
    expect(tileOf(await board(), id)).toMatchObject({ readiness: 'held', lastCheck: { at, outcome: 'fail', initials: 'TS' } })
  })
})
