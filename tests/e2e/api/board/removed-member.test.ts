// A member removed from a competition stops hearing its board at once, on an open socket and on
// every instance: the organiser's removal takes that person's sockets out of the rooms their
// remaining roles no longer allow. Each time, another member's socket receives the very event
// the removed one must not (and, for a downgraded member, the news they still may hear).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { boardSocket, eventsSoFar, joinBoard, openToday, type BoardSocket } from '../../../support/board'
import { startServer, type RunningServer } from '../../../support/server'
import { ApiClient, signedUpClient } from '../../../support/api'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
const sockets: BoardSocket[] = []
const servers: RunningServer[] = []
async function connect(url: string, client: ApiClient) {
  const s = await boardSocket(url, client)
  sockets.push(s)
  return s
}

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Removal Cup')
  entryId = await gridEntry(w, { compId: 'R1' })
  await openToday(w)
})
afterAll(async () => {
  for (const s of sockets) s.close()
  for (const s of servers) await s.stop()
  await closeTestDb()
})

async function membershipId(userId: string, role: string): Promise<string> {
  const row = await testDb()('memberships').where({ user_id: userId, competition_id: w.competitionId, role }).first('id')
  return row.id
}

async function remove(userId: string, role: string) {
  const res = await w.organiser.client.request('DELETE', `${w.base}/memberships/${await membershipId(userId, role)}`)
  expect(res.status).toBe(204)
}

describe('a removed member’s sockets', () => {
  it('stop receiving the board once the role is removed; another member’s socket still does', async () => {
    const removed = await connect(baseUrl, w.scrutineer2.client)
    const control = await connect(baseUrl, w.director.client)
    expect(await joinBoard(removed, w.competitionId)).toEqual({ ok: true, scope: 'staff' })
    expect(await joinBoard(control, w.competitionId)).toEqual({ ok: true, scope: 'staff' })

    // Before: both hear the same check.
    const before = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
    expect(before.status).toBe(201)
    const seqBefore = (await control.next('board:tile', e => e.entryId === entryId)).seq
    expect((await removed.next('board:tile', e => e.entryId === entryId)).seq).toBe(seqBefore)

    await remove(w.scrutineer2.user.id, 'scrutineer')
    // Whatever the board published up to here (another instance starting refreshes every open
    // day) may have reached the socket; nothing after.
    const { seq } = (await w.director.client.get(`${w.base}/board`)).body

    const after = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
    expect(after.status).toBe(201)
    const heard = await control.next('board:tile', e => e.entryId === entryId && e.seq > seqBefore)
    expect(heard.seq).toBeGreaterThan(seqBefore)
    // The socket stays open (its user is still signed in) but hears nothing more of this board.
    expect(removed.socket.connected).toBe(true)
    expect((await eventsSoFar(removed, 'board:tile')).filter(e => e.seq > seq)).toEqual([])
    // Nor can it simply ask to be let back in.
    expect(await joinBoard(removed, w.competitionId)).toMatchObject({ ok: false })
  })

  it('a member downgraded to entrant leaves the staff board but still hears of their own entry', async () => {
    // The entrant also scrutineers (a second role in the same competition).
    await testDb()('memberships').insert({ user_id: w.entrant.user.id, competition_id: w.competitionId, role: 'scrutineer' })
    const downgraded = await connect(baseUrl, w.entrant.client)
    const control = await connect(baseUrl, w.director.client)
    expect(await joinBoard(downgraded, w.competitionId)).toEqual({ ok: true, scope: 'staff' })
    await joinBoard(control, w.competitionId)

    await remove(w.entrant.user.id, 'scrutineer')

    // A hold on the entrant's own entry: the board hears the tile, the entrant their news.
    const hold = await w.director.client.post(`${w.base}/entries/${entryId}/hold`, { reason: 'Tow hook worn' })
    expect(hold.status).toBe(201)
    const tile = await control.next('board:tile', e => e.entryId === entryId && e.tile?.readiness === 'held')
    const news = await downgraded.next('entry:readiness', e => e.entryId === entryId && e.readiness === 'held')
    expect(news.hold).toMatchObject({ reason: 'Tow hook worn' })
    expect((await eventsSoFar(downgraded, 'board:tile')).filter(e => e.seq >= tile.seq)).toEqual([])
    expect(await joinBoard(downgraded, w.competitionId)).toEqual({ ok: true, scope: 'own' })

    const release = await w.director.client.post(`${w.base}/entries/${entryId}/release`, { reason: 'Tow hook replaced' })
    expect(release.status).toBe(201)
  })

  it('on another instance too', async () => {
    const second = await startServer()
    servers.push(second)
    // A starting instance first rebuilds every open day of the database (board-start.ts), which
    // in a full test run holds many: the test begins once that is done.
    const deadline = Date.now() + 80_000
    while (!/open days (brought up to date|not rebuilt)/.test(second.output())) {
      if (Date.now() > deadline) throw new Error(`The second instance did not finish rebuilding the open days:\n${second.output()}`)
      await new Promise(r => setTimeout(r, 100))
    }
    const remote = await signedUpClient(baseUrl, 'Rhea Remote')
    await testDb()('memberships').insert({ user_id: remote.user.id, competition_id: w.competitionId, role: 'director' })
    // Both sockets are connected to the second instance; the removal and the change go
    // through the first.
    const onSecond = (client: ApiClient) => {
      const c = new ApiClient(second.url, client.address)
      c.cookie = client.cookie
      return c
    }
    const removed = await connect(second.url, onSecond(remote.client))
    const control = await connect(second.url, onSecond(w.director.client))
    expect(await joinBoard(removed, w.competitionId)).toEqual({ ok: true, scope: 'staff' })
    expect(await joinBoard(control, w.competitionId)).toEqual({ ok: true, scope: 'staff' })
    // Before: a check through the first instance reaches both. The second instance hears the
    // first once its adapter LISTENs, which it sets up on its own after start: until a check
    // through the first reaches it, another is sent (for at most 30 s).
    const ready = Date.now() + 30_000
    let seen: { seq: number } | undefined
    while (!seen) {
      const first = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
      expect(first.status).toBe(201)
      seen = await control.next('board:tile', e => e.entryId === entryId, 3_000).catch(() => undefined)
      if (!seen && Date.now() > ready) throw new Error(`The second instance never heard the first:\n${second.output()}`)
    }
    const seenSeq = seen.seq
    expect((await removed.next('board:tile', e => e.seq === seenSeq)).entryId).toBe(entryId)

    await remove(remote.user.id, 'director')

    const { seq } = (await w.director.client.get(`${w.base}/board`)).body
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
    expect(res.status).toBe(201)
    const heard = await control.next('board:tile', e => e.entryId === entryId && e.seq > seq, 20_000)
    expect(heard.competitionId).toBe(w.competitionId)
    expect((await eventsSoFar(removed, 'board:tile')).filter(e => e.seq > seq)).toEqual([])
    expect(removed.socket.connected).toBe(true)
  }, 120_000)
})
