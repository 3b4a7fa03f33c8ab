/* eslint-disable @typescript-eslint/no-explicit-any -- pushed events are what the tests assert */
// The board's socket.io pushes against the built server: a grid check reaches a connected board
// at once; a handshake without a valid session is refused; a socket joins only the boards of
// competitions its user belongs to, and an entrant hears only of their own entries; sequence
// numbers leave no holes, so a screen that missed changes notices and catches up from the
// snapshot; signing out closes the session's sockets.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { boardSocket, eventsSoFar, joinBoard, openToday, type BoardSocket } from '../../../support/board'
import { offer, rebase, sequenceState } from '#shared/utils/board-sequence'

const baseUrl = inject('baseUrl')

let a: GridWorld
let b: GridWorld
let aEntry: string
let aOther: string
let bEntry: string
const sockets: BoardSocket[] = []
async function connect(client: ApiClient | null, opts?: Parameters<typeof boardSocket>[2]) {
  const s = await boardSocket(baseUrl, client, opts)
  sockets.push(s)
  return s
}

beforeAll(async () => {
  [a, b] = await Promise.all([gridWorld(baseUrl, 'Socket Cup A'), gridWorld(baseUrl, 'Socket Cup B')])
  aEntry = await gridEntry(a, { compId: 'A1' })
  aOther = await gridEntry(a, { compId: 'A2' })
  await testDb()('entries').where({ id: aOther }).update({ entrant_user_id: a.otherEntrant.user.id })
  await testDb()('memberships').insert({ user_id: a.otherEntrant.user.id, competition_id: a.competitionId, role: 'entrant' }).onConflict(['user_id', 'competition_id', 'role']).ignore()
  bEntry = await gridEntry(b, { compId: 'B1' })
  await Promise.all([openToday(a), openToday(b)])
})
afterAll(async () => {
  for (const s of sockets) s.close()
  await closeTestDb()
})

const snapshot = async (w: GridWorld) => (await w.director.client.get(`${w.base}/board`)).body

describe('the handshake', () => {
  it('is refused without a session, with a forged cookie and after sign-out', async () => {
    await expect(connect(null)).rejects.toThrow(/Sign in to see the live board/)
    await expect(connect(null, { transports: ['polling'] })).rejects.toThrow(/Sign in/)
    const forged = new ApiClient(baseUrl)
    forged.cookie = 'gridmark-session=Fe26.2**forged'
    await expect(connect(forged)).rejects.toThrow(/Sign in/)
  })

  it('is accepted with a session over websocket and over polling', async () => {
    for (const transports of [['websocket'], ['polling']] as const) {
      const s = await connect(a.director.client, { transports: [...transports] })
      expect(await joinBoard(s, a.competitionId)).toEqual({ ok: true, scope: 'staff' })
      s.close()
    }
  })
})

describe('pushes', () => {
  it('a grid check reaches a connected board with the next sequence number', async () => {
    const s = await connect(a.scrutineer2.client)
    expect(await joinBoard(s, a.competitionId)).toEqual({ ok: true, scope: 'staff' })
    const before = await snapshot(a)
    const res = await a.scrutineer.client.post(`${a.base}/grid-checks`, checkBody(aEntry))
    expect(res.status).toBe(201)
    const event = await s.next('board:tile', e => e.entryId === aEntry)
    expect(event).toMatchObject({ competitionId: a.competitionId, cause: 'grid-check', seq: before.seq + 1, tile: { entryId: aEntry, compId: 'A1', readiness: 'ready', lastCheck: { initials: 'SS' } } })
    // What was pushed is what the snapshot now says.
    expect((await snapshot(a)).tiles.find((t: any) => t.entryId === aEntry)).toEqual(event.tile)
  })

  it('keeps each competition’s board to its own members', async () => {
    const s = await connect(a.director.client)
    expect(await joinBoard(s, a.competitionId)).toMatchObject({ ok: true })
    const refused = await joinBoard(s, b.competitionId)
    expect(refused).toEqual({ ok: false, message: 'You are not part of that competition’s board.' })
    expect(await joinBoard(s, 'not-an-id')).toMatchObject({ ok: false })
    const sb = await connect(b.director.client)
    expect(await joinBoard(sb, b.competitionId)).toMatchObject({ ok: true })

    expect((await b.scrutineer.client.post(`${b.base}/grid-checks`, checkBody(bEntry))).status).toBe(201)
    await sb.next('board:tile', e => e.entryId === bEntry)
    const heardInA = (await eventsSoFar(s, 'board:tile')).filter(e => e.competitionId === b.competitionId)
    expect(heardInA).toEqual([])
    // An outsider's socket joins nothing and hears nothing.
    const outsider = await connect(a.outsider.client)
    expect(await joinBoard(outsider, a.competitionId)).toMatchObject({ ok: false })
    expect((await a.scrutineer.client.post(`${a.base}/grid-checks`, checkBody(aOther))).status).toBe(201)
    await s.next('board:tile', e => e.entryId === aOther)
    expect(await eventsSoFar(outsider, 'board:tile')).toEqual([])
  })

  it('tells an entrant of their own entry only, never the whole board', async () => {
    const mine = await connect(a.entrant.client)
    expect(await joinBoard(mine, a.competitionId)).toEqual({ ok: true, scope: 'own' })
    const theirs = await connect(a.otherEntrant.client)
    expect(await joinBoard(theirs, a.competitionId)).toEqual({ ok: true, scope: 'own' })

    expect((await a.director.client.post(`${a.base}/entries/${aEntry}/hold`, { reason: 'Tow hook worn' })).status).toBe(201)
    const news = await mine.next('entry:readiness', e => e.entryId === aEntry)
    expect(news).toMatchObject({ competitionId: a.competitionId, entryId: aEntry, readiness: 'held', hold: { reason: 'Tow hook worn' } })
    await Promise.all([eventsSoFar(mine, 'entry:readiness'), eventsSoFar(theirs, 'entry:readiness')])
    expect(theirs.received.filter(([n, e]) => n === 'entry:readiness' && e.entryId === aEntry)).toEqual([])
    expect(mine.received.filter(([n]) => n.startsWith('board:'))).toEqual([])
    expect(theirs.received.filter(([n]) => n.startsWith('board:'))).toEqual([])
  })
})

describe('sequence numbers', () => {
  it('leave no holes, so a screen that missed changes sees the gap and catches up from the snapshot', async () => {
    const s = await connect(a.director.client)
    await joinBoard(s, a.competitionId)
    const screen = await snapshot(a)
    const state = sequenceState<any>(screen.seq)
    const tiles = new Map<string, any>(screen.tiles.map((t: any) => [t.entryId, t]))

    // The screen loses its connection; two changes happen meanwhile.
    s.close()
    expect((await a.scrutineer.client.post(`${a.base}/grid-checks`, checkBody(aEntry, { answers: [{ itemId: 'antennas', result: 'fail' }] }))).status).toBe(201)
    expect((await a.director.client.post(`${a.base}/entries/${aEntry}/release`, { reason: 'Tow hook replaced' })).status).toBe(201)

    // Back online, the next push is numbered past the ones it missed: a gap.
    const back = await connect(a.director.client)
    await joinBoard(back, a.competitionId)
    expect((await a.scrutineer.client.post(`${a.base}/grid-checks`, checkBody(aOther))).status).toBe(201)
    const event = await back.next('board:tile', e => e.entryId === aOther)
    expect(event.seq).toBe(screen.seq + 3)
    expect(offer(state, event)).toEqual({ kind: 'gap', missing: screen.seq + 1 })

    // It fetches the board again and applies what follows the snapshot: the same board as the server's.
    const fresh = await snapshot(a)
    for (const t of fresh.tiles) tiles.set(t.entryId, t)
    expect(rebase(state, fresh.seq)).toEqual([])
    expect(state.seq).toBe(fresh.seq)
    expect(tiles.get(aEntry)).toMatchObject({ readiness: 'held', headline: { kind: 'checklist' } })
    expect(tiles.get(aOther)).toEqual(event.tile)
  })

  it('numbers every change of a competition once, in order, across concurrent writers', async () => {
    const s = await connect(a.director.client)
    await joinBoard(s, a.competitionId)
    const start = (await snapshot(a)).seq
    const posts = await Promise.all(Array.from({ length: 6 }, (_, i) =>
      (i % 2 ? a.scrutineer2 : a.scrutineer).client.post(`${a.base}/grid-checks`, checkBody(i % 2 ? aOther : aEntry, {
        checkedAt: new Date(Date.now() + i * 1000).toISOString(),
      }))))
    expect(posts.map(p => p.status)).toEqual([201, 201, 201, 201, 201, 201])
    const end = (await snapshot(a)).seq
    // A check older than one already stored does not change its tile, so not every check takes a number.
    expect(end).toBeGreaterThan(start)
    await s.next('board:tile', e => e.seq === end)
    // Each number once (a screen puts a rare late one back in order itself: board-sequence.ts).
    const seqs = s.received.filter(([n, e]) => n === 'board:tile' && e.seq > start).map(([, e]) => e.seq).sort((x, y) => x - y)
    expect(seqs).toEqual(Array.from({ length: end - start }, (_, i) => start + 1 + i))
  })
})

describe('signing out', () => {
  it('closes the live connections of that session', async () => {
    const { signedUpClient } = await import('../../../support/api')
    const who = await signedUpClient(baseUrl, 'Leaving Scrutineer')
    await testDb()('memberships').insert({ user_id: who.user.id, competition_id: a.competitionId, role: 'scrutineer' })
    const s = await connect(who.client)
    expect(await joinBoard(s, a.competitionId)).toMatchObject({ ok: true })
    const closed = new Promise(resolve => s.socket.once('disconnect', resolve))
    expect((await who.client.post('/api/auth/logout')).status).toBeLessThan(300)
    expect(await closed).toBe('io server disconnect')
    await expect(connect(who.client)).rejects.toThrow(/Sign in/)
  })
})
