import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import { createPinia, setActivePinia } from 'pinia'
import type { Readiness } from '#shared/engine'
import type { BoardSnapshot, BoardTile, BoardTileEvent } from '#shared/types/api-board'
import { BOARD_TIMING } from '~/stores/board'
import type { BoardSocketConnector, BoardSocketHandlers } from '~/utils/boardSocket'

// The board store against a mocked API (snapshot and sequence routes) and a stand-in socket:
// the tests drive the handlers the store hands to its socket, exactly as socket.io would call them.

const cid = '0b7e3c1a-5d2f-4e8a-9c61-3f2a1b0c9d01'
const DAY = '2027-07-13'
const classes = [{ id: 'k-open', name: 'Open' }, { id: 'k-std', name: 'Standard' }]

function tile(entryId: string, compId: string, readiness: Readiness, seq: number, classId = 'k-open'): BoardTile {
  return {
    entryId, compId, classId, className: classId === 'k-open' ? 'Open' : 'Standard',
    pilotName: `Pilot ${compId}`, registration: `G-${compId}`, gliderType: 'Test glider',
    readiness,
    headline: readiness === 'held' ? { kind: 'checklist', text: 'Failed on the grid: canopy' } : null,
    counts: { blocking: readiness === 'held' ? 1 : 0, advisory: 0, waived: 0 },
    lastCheck: readiness === 'unchecked' ? null : { at: '2027-07-13T08:02:00Z', initials: 'SC', name: 'Sam Check', outcome: readiness === 'held' ? 'fail' : 'pass' },
    hold: null,
    seq,
    updatedAt: '2027-07-13T08:02:00Z',
  }
}

/** What the mocked server holds: its tiles and sequence number, and how often it was asked. */
interface FakeServer {
  seq: number
  tiles: BoardTile[]
  day: BoardSnapshot['day']
  fail: boolean
  /** While set, both routes refuse this screen with this status (its access ended). */
  refused: 401 | 403 | null
  snapshots: number
  seqChecks: number
  /** While set, the snapshot answer waits for it. */
  gate: Promise<void> | null
}
let server: FakeServer

function snapshot(): BoardSnapshot {
  return {
    competition: { id: cid, name: 'Test Cup', timeZone: 'Europe/Berlin' },
    day: server.day,
    seq: server.seq,
    classes,
    tiles: structuredClone(server.tiles),
    generatedAt: new Date().toISOString(),
  }
}

const REFUSED = 'You hold no role in this competition that lets you see its board.'
function refusal(event: Parameters<typeof setResponseStatus>[0]) {
  setResponseStatus(event, server.refused!)
  return { statusCode: server.refused, message: REFUSED }
}

/** The server records a change: its tile and the next number, and the event it would push. */
function change(t: Omit<BoardTile, 'seq'> & { seq?: number }): BoardTileEvent {
  server.seq++
  const next = { ...t, seq: server.seq } as BoardTile
  server.tiles = server.tiles.map(x => (x.entryId === next.entryId ? next : x))
  if (!server.tiles.some(x => x.entryId === next.entryId)) server.tiles.push(next)
  return { competitionId: cid, day: DAY, seq: server.seq, cause: 'grid-check', entryId: next.entryId, tile: next }
}

function fakeSocket() {
  const state: { handlers: BoardSocketHandlers | null, closed: boolean } = { handlers: null, closed: false }
  const connect: BoardSocketConnector = (competitionId, handlers) => {
    expect(competitionId).toBe(cid)
    state.handlers = handlers
    return { close: () => { state.closed = true } }
  }
  return { connect, state, get on() { return state.handlers! } }
}

const cleanups: (() => void)[] = []
beforeEach(() => {
  setActivePinia(createPinia())
  server = {
    seq: 10,
    tiles: [tile('e1', '11', 'unchecked', 3), tile('e2', '22', 'ready', 7), tile('e3', 'K9', 'caution', 9, 'k-std')],
    day: { day: DAY, kind: 'contest', status: 'open', openedAt: '2027-07-13T06:00:00Z', openedBy: 'Dana Director', closedAt: null, closedBy: null },
    fail: false,
    refused: null,
    snapshots: 0,
    seqChecks: 0,
    gate: null,
  }
  cleanups.push(registerEndpoint(`/api/competitions/${cid}/board`, async (event) => {
    server.snapshots++
    if (server.gate) await server.gate
    if (server.refused) return refusal(event)
    if (server.fail) {
      setResponseStatus(event, 503)
      return { statusCode: 503, message: 'The database is not reachable just now.' }
    }
    return snapshot()
  }))
  cleanups.push(registerEndpoint(`/api/competitions/${cid}/board/seq`, (event) => {
    server.seqChecks++
    if (server.refused) return refusal(event)
    return { seq: server.seq, openDay: DAY }
  }))
})
afterEach(() => {
  useBoardStore().close()
  vi.useRealTimers()
  while (cleanups.length) cleanups.pop()!()
})

/** Opens the board and joins, as on a page load: live at the server's sequence number. */
async function openLive(timing = {}) {
  const board = useBoardStore()
  const socket = fakeSocket()
  await board.open(cid, { connect: socket.connect, timing })
  socket.on.joined({ ok: true, scope: 'staff' })
  await vi.waitFor(() => expect(board.connection).toBe('live'))
  return { board, socket }
}

/**
 * The store's own timers (gap wait, sequence poll, retries) on a clock the test moves, so a
 * test knows they have fired; promises, and the mocked API, still run for real.
 */
function fakeClock() {
  vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setInterval', 'clearInterval'] })
}

/**
 * Nothing fetched the board: no fetch is under way (a fetch marks the board loading at once)
 * and the server was not asked (one that already ran would have counted).
 */
function expectNotFetched(board: ReturnType<typeof useBoardStore>, snapshotsBefore: number) {
  expect(board.loading).toBe(false)
  expect(server.snapshots).toBe(snapshotsBefore)
}

/**
 * The board as a page arrives with it: the server's render read it (`serve`), and the page's
 * payload brings the store's state, every field of it, to the browser's store.
 */
function servedBoard() {
  const read = snapshot()
  const payload = {
    ...useBoardStore().$state,
    competitionId: cid, competition: read.competition, day: read.day, classes: read.classes, seq: read.seq,
    tiles: Object.fromEntries(read.tiles.map(t => [t.entryId, t])), order: read.tiles.map(t => t.entryId), loaded: true, served: true,
  }
  const pinia = createPinia()
  pinia.state.value.board = JSON.parse(JSON.stringify(payload))
  setActivePinia(pinia)
  return useBoardStore()
}

describe('board store', () => {
  it('shows the snapshot, then goes live once it has joined and the server’s number shows nothing missed', async () => {
    const board = useBoardStore()
    const socket = fakeSocket()
    await board.open(cid, { connect: socket.connect })
    expect(board.loaded).toBe(true)
    expect(board.connection).toBe('connecting')
    expect(board.orderedTiles.map(t => t.compId)).toEqual(['11', '22', 'K9'])
    expect(board.seq).toBe(10)
    const before = { snapshots: server.snapshots, seqChecks: server.seqChecks }
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    // The number read after the join is the board's own: nothing was missed, the board is not
    // fetched again.
    expect(server.seqChecks).toBe(before.seqChecks + 1)
    expect(server.snapshots).toBe(before.snapshots)
    expect(board.offlineSince).toBeNull()
  })

  it('goes live from the board the server’s render read, asking only for the number', async () => {
    const board = servedBoard()
    server.snapshots = 0
    // Drawn as the server drew it: connecting, not "not live".
    expect(board.connection).toBe('connecting')
    expect(board.orderedTiles.map(t => t.compId)).toEqual(['11', '22', 'K9'])
    const socket = fakeSocket()
    await board.open(cid, { connect: socket.connect })
    expect(server.snapshots).toBe(0)
    expect(board.served).toBe(false)
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(server.snapshots).toBe(0)
    expect(server.seqChecks).toBe(1)
    expect(board.seq).toBe(10)
  })

  it('fetches the board after joining when it changed since the server’s render read it', async () => {
    const board = servedBoard()
    server.snapshots = 0
    const socket = fakeSocket()
    await board.open(cid, { connect: socket.connect })
    change(tile('e2', '22', 'held', 0))
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(server.snapshots).toBe(1)
    expect(board.seq).toBe(11)
    expect(board.tiles.e2!.readiness).toBe('held')
  })

  it('fetches the board after joining when it changed before the join (not pushed to this screen)', async () => {
    const board = useBoardStore()
    const socket = fakeSocket()
    await board.open(cid, { connect: socket.connect })
    const before = server.snapshots
    change(tile('e2', '22', 'held', 0))
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(server.snapshots).toBe(before + 1)
    expect(board.seq).toBe(11)
    expect(board.tiles.e2!.readiness).toBe('held')
  })

  it('goes live without fetching when the changes since the board was read came pushed before the number', async () => {
    const board = useBoardStore()
    const socket = fakeSocket()
    await board.open(cid, { connect: socket.connect })
    const before = server.snapshots
    socket.on.joined({ ok: true, scope: 'staff' })
    socket.on.tile(change(tile('e1', '11', 'ready', 0)))
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(server.snapshots).toBe(before)
    expect(board.seq).toBe(11)
    expect(board.tiles.e1!.readiness).toBe('ready')
  })

  it('draws again only the tiles that changed when the board is fetched again', async () => {
    const { board, socket } = await openLive()
    const before = { ...board.tiles }
    const orderBefore = board.order
    // e3 changes on the server while the screen is away; it comes back and fetches the board.
    change(tile('e3', 'K9', 'held', 0, 'k-std'))
    socket.on.disconnected('transport close')
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(board.seq).toBe(11)
    // The unchanged tiles keep their objects (not drawn again), the changed one is new and
    // highlighted, and the order, the same, keeps its list.
    expect(board.tiles.e1).toBe(before.e1)
    expect(board.tiles.e2).toBe(before.e2)
    expect(board.tiles.e3).not.toBe(before.e3)
    expect(board.tiles.e3!.readiness).toBe('held')
    expect(board.changed).toEqual(['e3'])
    expect(board.order).toBe(orderBefore)
  })

  it('applies the next change at once, highlights it, and the counters follow', async () => {
    const { board, socket } = await openLive()
    expect(board.counts.overall).toMatchObject({ ready: 1, caution: 1, held: 0, unchecked: 1, total: 3 })
    expect(board.counts.byClass['k-std']).toMatchObject({ caution: 1, total: 1 })

    socket.on.tile(change(tile('e1', '11', 'held', 0)))
    expect(board.seq).toBe(11)
    expect(board.tiles.e1!.readiness).toBe('held')
    expect(board.changed).toEqual(['e1'])
    expect(board.heldAlerts).toBe(1)
    expect(board.counts.overall).toMatchObject({ ready: 1, caution: 1, held: 1, unchecked: 0, total: 3 })
    expect(board.counts.byClass['k-open']).toMatchObject({ held: 1, ready: 1, unchecked: 0, total: 2 })

    // A change of a held tile that stays held does not chime again.
    socket.on.tile(change({ ...tile('e1', '11', 'held', 0), headline: { kind: 'hold', text: 'Canopy crack' } }))
    expect(board.tiles.e1!.headline?.text).toBe('Canopy crack')
    expect(board.heldAlerts).toBe(1)

    // A tile that leaves the board (null) is removed and counted no more.
    server.seq++
    socket.on.tile({ competitionId: cid, day: DAY, seq: server.seq, cause: 'dossier', entryId: 'e2', tile: null })
    expect(board.tiles.e2).toBeUndefined()
    expect(board.orderedTiles.map(t => t.compId)).toEqual(['11', 'K9'])
    expect(board.counts.overall).toMatchObject({ ready: 0, held: 1, total: 2 })
  })

  it('ignores a change it already shows (at or below its sequence number)', async () => {
    fakeClock()
    const { board, socket } = await openLive()
    const snapshotsBefore = server.snapshots
    socket.on.tile({ competitionId: cid, day: DAY, seq: 10, cause: 'grid-check', entryId: 'e2', tile: tile('e2', '22', 'held', 10) })
    socket.on.tile({ competitionId: cid, day: DAY, seq: 4, cause: 'grid-check', entryId: 'e1', tile: tile('e1', '11', 'ready', 4) })
    expect(board.tiles.e2!.readiness).toBe('ready')
    expect(board.tiles.e1!.readiness).toBe('unchecked')
    expect(board.seq).toBe(10)
    expect(board.changed).toEqual([])
    // Past the wait for a missing change: no gap was seen, so nothing is fetched.
    await vi.advanceTimersByTimeAsync(BOARD_TIMING.gapWaitMs + 200)
    expectNotFetched(board, snapshotsBefore)
  })

  it('waits for a missing change, then fetches the board when the gap does not fill', async () => {
    const { board, socket } = await openLive()
    const snapshotsBefore = server.snapshots
    change(tile('e1', '11', 'ready', 0)) // seq 11: pushed, but lost on the way
    const later = change(tile('e3', 'K9', 'held', 0, 'k-std')) // seq 12
    socket.on.tile(later)
    // Not applied out of order, and not fetched at once: the missing one may only be late.
    expect(board.tiles.e3!.readiness).toBe('caution')
    expect(board.seq).toBe(10)
    expect(server.snapshots).toBe(snapshotsBefore)
    await vi.waitFor(() => expect(server.snapshots).toBe(snapshotsBefore + 1), { timeout: 2000 })
    await vi.waitFor(() => expect(board.seq).toBe(12))
    expect(board.tiles.e1!.readiness).toBe('ready')
    expect(board.tiles.e3!.readiness).toBe('held')
    // Both tiles moved on in the fetched board: both are highlighted.
    expect([...board.changed].sort()).toEqual(['e1', 'e3'])
  })

  it('applies a late change that fills the gap, in order, without fetching the board', async () => {
    fakeClock()
    const { board, socket } = await openLive()
    const snapshotsBefore = server.snapshots
    const first = change(tile('e1', '11', 'caution', 0)) // 11
    const second = change(tile('e1', '11', 'ready', 0)) // 12
    socket.on.tile(second)
    expect(board.tiles.e1!.readiness).toBe('unchecked')
    await vi.advanceTimersByTimeAsync(100)
    socket.on.tile(first)
    expect(board.seq).toBe(12)
    // Applied in sequence order: the later change wins.
    expect(board.tiles.e1!.readiness).toBe('ready')
    // Past the time the gap would have been given: filled, it fetched nothing.
    await vi.advanceTimersByTimeAsync(BOARD_TIMING.gapWaitMs + 200)
    expectNotFetched(board, snapshotsBefore)
  })

  it('after a reconnect fetches the board again and shows what changed while away', async () => {
    const { board, socket } = await openLive()
    socket.on.disconnected('transport close')
    expect(board.connection).toBe('reconnecting')
    expect(board.offlineSince).not.toBeNull()

    // Meanwhile a glider is held; the push never reached this screen.
    change(tile('e2', '22', 'held', 0))
    const snapshotsBefore = server.snapshots
    socket.on.joined({ ok: true, scope: 'staff' })
    // Not live again until the board fetched after the join is in.
    expect(board.connection).toBe('reconnecting')
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(server.snapshots).toBe(snapshotsBefore + 1)
    expect(board.tiles.e2!.readiness).toBe('held')
    expect(board.seq).toBe(11)
    expect(board.changed).toEqual(['e2'])
    expect(board.heldAlerts).toBe(1)
    expect(board.offlineSince).toBeNull()
  })

  it('keeps changes pushed while the board is being fetched and applies those above its number', async () => {
    const { board, socket } = await openLive()
    let release!: () => void
    server.gate = new Promise<void>((r) => { release = r })
    const before = server.snapshots
    const fetching = board.refresh()
    await vi.waitFor(() => expect(server.snapshots).toBe(before + 1))
    // Seq 11 is committed before the snapshot is read (so it is in it) and pushed meanwhile;
    // seq 12 is pushed while the answer is on its way (not in it).
    const inSnapshot = change(tile('e1', '11', 'caution', 0))
    const afterSnapshot: BoardTileEvent = { competitionId: cid, day: DAY, seq: 12, cause: 'grid-check', entryId: 'e1', tile: tile('e1', '11', 'ready', 12) }
    socket.on.tile(inSnapshot)
    socket.on.tile(afterSnapshot)
    // Held back, not applied on top of a board about to be replaced.
    expect(board.tiles.e1!.readiness).toBe('unchecked')
    expect(board.seq).toBe(10)
    release()
    await fetching
    expect(board.seq).toBe(12)
    expect(board.tiles.e1!.readiness).toBe('ready')
    expect(server.snapshots).toBe(before + 1)
  })

  it('fetches the board again when a day is opened or closed', async () => {
    fakeClock()
    const { board, socket } = await openLive()
    const snapshotsBefore = server.snapshots
    server.seq++
    server.day = { ...server.day!, status: 'closed', closedAt: '2027-07-13T18:00:00Z', closedBy: 'Dana Director' }
    socket.on.day({ competitionId: cid, seq: server.seq, day: server.day })
    await vi.waitFor(() => expect(board.day?.status).toBe('closed'))
    expect(server.snapshots).toBe(snapshotsBefore + 1)
    // A day change it already shows (an old number) is not fetched again.
    socket.on.day({ competitionId: cid, seq: server.seq, day: server.day })
    await vi.advanceTimersByTimeAsync(BOARD_TIMING.gapWaitMs + 200)
    expectNotFetched(board, snapshotsBefore + 1)
  })

  it('asks for the sequence number while live and fetches the board when the server is ahead', async () => {
    const { board } = await openLive({ seqPollMs: 60 })
    const snapshotsBefore = server.snapshots
    change(tile('e3', 'K9', 'ready', 0, 'k-std')) // a push lost between two server instances
    await vi.waitFor(() => expect(board.tiles.e3!.readiness).toBe('ready'), { timeout: 2000 })
    expect(server.seqChecks).toBeGreaterThan(0)
    expect(server.snapshots).toBe(snapshotsBefore + 1)
  })

  it('says so when the server refuses its sequence poll (the screen’s access ended), keeping the board shown', async () => {
    const { board } = await openLive({ seqPollMs: 60, snapshotRetryMs: 10_000 })
    const snapshotsBefore = server.snapshots
    // The director's role removed while the screen's socket stays connected, out of the room:
    // no push says anything; the next poll is refused.
    server.refused = 403
    await vi.waitFor(() => expect(board.loadError).toBe(REFUSED), { timeout: 2000 })
    expect(board.connection).toBe('refused')
    expect(server.snapshots).toBe(snapshotsBefore + 1)
    expect(board.orderedTiles).toHaveLength(3)
    // Given access again, the next fetch makes it live.
    server.refused = null
    await board.refresh()
    expect(board.connection).toBe('live')
    expect(board.loadError).toBeNull()
  })

  it('is not live when the board cannot be fetched, and says offline after a long outage', async () => {
    const { board, socket } = await openLive({ offlineAfterMs: 150, snapshotRetryMs: 10_000 })
    server.fail = true
    await board.refresh()
    expect(board.connection).toBe('reconnecting')
    expect(board.loadError).toContain('database')
    expect(board.offlineSince).not.toBeNull()
    // The board shown stays (marked not live), it is not emptied.
    expect(board.orderedTiles).toHaveLength(3)
    await vi.waitFor(() => expect(board.connection).toBe('offline'))

    server.fail = false
    socket.on.joined({ ok: true, scope: 'staff' })
    await vi.waitFor(() => expect(board.connection).toBe('live'))
    expect(board.loadError).toBeNull()
    expect(board.offlineSince).toBeNull()
  })

  it('says offline at once when the browser has no network', async () => {
    const { board } = await openLive()
    window.dispatchEvent(new Event('offline'))
    expect(board.connection).toBe('offline')
    expect(board.offlineSince).not.toBeNull()
    window.dispatchEvent(new Event('online'))
    await vi.waitFor(() => expect(board.connection).toBe('live'))
  })

  it('narrows the groups by class and readiness, keeping the board order', async () => {
    const { board } = await openLive()
    expect(board.groups.map(g => [g.className, g.tiles.map(t => t.compId)])).toEqual([['Open', ['11', '22']], ['Standard', ['K9']]])
    board.setFilters({ readiness: ['ready', 'caution'] })
    expect(board.groups.map(g => [g.className, g.tiles.map(t => t.compId)])).toEqual([['Open', ['22']], ['Standard', ['K9']]])
    board.setFilters({ classIds: ['k-std'] })
    expect(board.groups.map(g => g.className)).toEqual(['Standard'])
    expect(board.shownCount).toBe(1)
    // Counters stay those of the whole board.
    expect(board.counts.overall.total).toBe(3)
  })

  it('puts a glider that joins the board in competition-ID order within its class', async () => {
    const { board, socket } = await openLive()
    socket.on.tile(change(tile('e4', '15', 'unchecked', 0)))
    expect(board.orderedTiles.map(t => t.compId)).toEqual(['11', '15', '22', 'K9'])
    socket.on.tile(change(tile('e5', 'A2', 'unchecked', 0)))
    expect(board.orderedTiles.map(t => t.compId)).toEqual(['11', '15', '22', 'A2', 'K9'])
  })

  it('stops the socket and its timers when closed', async () => {
    fakeClock()
    const { board, socket } = await openLive({ seqPollMs: 1_000 })
    // The poll runs while the board is open…
    const polled = server.seqChecks
    await vi.advanceTimersByTimeAsync(1_000)
    await vi.waitFor(() => expect(server.seqChecks).toBe(polled + 1))
    board.close()
    expect(socket.state.closed).toBe(true)
    // …and no timer of the board is left once it is closed.
    expect(vi.getTimerCount()).toBe(0)
    const checks = server.seqChecks
    await vi.advanceTimersByTimeAsync(5_000)
    expect(server.seqChecks).toBe(checks)
    // A late event of the closed board changes nothing.
    socket.on.tile(change(tile('e1', '11', 'ready', 0)))
    expect(board.tiles.e1!.readiness).toBe('unchecked')
  })
})
