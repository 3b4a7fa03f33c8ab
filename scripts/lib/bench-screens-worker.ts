// One process of the bench's screens (scripts/lib/bench-screens.ts starts several): some of
// the board screens on socket.io and some of the polling screens. Each notes when it first saw
// an entry's tile carrying a check, on the wall clock every process of the machine shares,
// and hands its notes to the bench when asked; the bench matches them with its checks.
// Kept apart from the 30 scrutineers' process so that 200 screens decoding the same frame do not
// queue behind each other, nor delay the scrutineers' requests.
import { performance, monitorEventLoopDelay } from 'node:perf_hooks'
import { io, type Socket } from 'socket.io-client'
import type { BoardJoinAck, BoardSnapshot, BoardTileEvent } from '../../shared/types/api-board'
import type { ScreensReport, ToScreens, FromScreens, ScreensSetup } from './bench-screens'

const wallClockMs = () => performance.timeOrigin + performance.now()

function send(message: FromScreens): void {
  process.send!(message)
}

let setup: ScreensSetup
const sockets: Socket[] = []
// Seen since the last report: [check key (entry id|lastCheck.at), screen index, wall-clock ms].
let pushSeen: [string, number, number][] = []
let pollSeen: [string, number, number][] = []
let outOfOrder = 0
let disconnects = 0
let failures: string[] = []
const loopDelay = monitorEventLoopDelay({ resolution: 1 })
let cpuAtStart = process.cpuUsage()
let wallAtStart = performance.now()
let polling = false
let pollLoops: Promise<void>[] = []
const pollTimers = new Set<{ timer: NodeJS.Timeout, wake: () => void }>()

async function connectBoard(index: number, cookie: string): Promise<Socket> {
  const socket = io(setup.baseUrl, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false, timeout: 20_000 })
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve())
    socket.once('connect_error', error => reject(new Error(`A board screen could not connect: ${error.message}`)))
  })
  const ack = await socket.timeout(20_000).emitWithAck('board:join', { competitionId: setup.competitionId }) as BoardJoinAck
  if (!ack.ok || ack.scope !== 'staff') throw new Error(`A board screen was not let in: ${JSON.stringify(ack)}`)
  let lastSeq = 0
  // A tile event costs one look-up here; the matching is the bench's, after the run.
  const seen = new Set<string>()
  socket.on('board:tile', (e: BoardTileEvent) => {
    const now = wallClockMs()
    if (e.seq <= lastSeq) outOfOrder++
    else lastSeq = e.seq
    const at = e.tile?.lastCheck?.at
    if (!at) return
    const key = `${e.entryId}|${at}`
    if (seen.has(key)) return
    seen.add(key)
    pushSeen.push([key, index, now])
  })
  socket.on('disconnect', (reason) => {
    if (reason !== 'io client disconnect') disconnects++
  })
  return socket
}

/** Runs `task` over `items` with at most `limit` at a time. */
async function inBatches<T>(items: readonly T[], limit: number, task: (item: T) => Promise<void>): Promise<void> {
  let next = 0
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, async () => {
    while (next < items.length) await task(items[next++]!)
  }))
}

// Polling screens: the last check each has seen per entry, so only changed tiles are looked at.
const pollState = new Map<number, Map<string, string>>()
async function poll(p: ScreensSetup['pollers'][number]): Promise<void> {
  const res = await fetch(`${setup.baseUrl}/api/competitions/${setup.competitionId}/board`, {
    headers: { 'cookie': p.cookie, 'x-forwarded-for': p.address, 'accept': 'application/json' },
  })
  const text = await res.text()
  const now = wallClockMs()
  if (res.status !== 200) {
    failures.push(`GET board answered ${res.status}`)
    return
  }
  let seen = pollState.get(p.index)
  if (!seen) pollState.set(p.index, seen = new Map())
  for (const tile of (JSON.parse(text) as BoardSnapshot).tiles) {
    const at = tile.lastCheck?.at
    if (!at || seen.get(tile.entryId) === at) continue
    seen.set(tile.entryId, at)
    pollSeen.push([`${tile.entryId}|${at}`, p.index, now])
  }
}

function pause(ms: number): Promise<void> {
  return new Promise((resolve) => {
    const entry = { timer: setTimeout(() => wake(), ms), wake: () => {} }
    const wake = () => {
      clearTimeout(entry.timer)
      pollTimers.delete(entry)
      resolve()
    }
    entry.wake = wake
    pollTimers.add(entry)
  })
}

function startPolling(): void {
  polling = true
  pollLoops = setup.pollers.map(async (p) => {
    // A random phase, then a fixed rhythm (a slow answer does not shift the next poll).
    let next = performance.now() + Math.random() * setup.pollIntervalMs
    while (polling) {
      await pause(Math.max(0, next - performance.now()))
      if (!polling) break
      next += setup.pollIntervalMs
      await poll(p).catch(error => failures.push(`GET board failed: ${(error as Error).message}`))
    }
  })
}

function report(): ScreensReport {
  const cpu = process.cpuUsage(cpuAtStart)
  const out: ScreensReport = {
    push: pushSeen,
    poll: pollSeen,
    outOfOrder,
    disconnects,
    failures,
    loopDelayP95Ms: loopDelay.count ? loopDelay.percentile(95) / 1e6 : 0,
    loopDelayMaxMs: loopDelay.count ? loopDelay.max / 1e6 : 0,
    cpuMs: (cpu.user + cpu.system) / 1000,
    wallMs: performance.now() - wallAtStart,
  }
  pushSeen = []
  pollSeen = []
  failures = []
  return out
}

async function handle(message: ToScreens): Promise<void> {
  switch (message.kind) {
    case 'connect':
      setup = message.setup
      await inBatches(setup.boards, 10, async (b) => {
        sockets.push(await connectBoard(b.index, b.cookie))
      })
      return send({ kind: 'connected', boards: sockets.length })
    case 'poll-once':
      await Promise.all(setup.pollers.map(p => poll(p)))
      return send({ kind: 'polled' })
    case 'busy':
      // The busy run's own figures: event-loop delay and CPU from here on.
      loopDelay.reset()
      loopDelay.enable()
      cpuAtStart = process.cpuUsage()
      wallAtStart = performance.now()
      startPolling()
      return send({ kind: 'busy' })
    case 'report':
      return send({ kind: 'report', report: report() })
    case 'stop-polling':
      polling = false
      for (const t of pollTimers) t.wake()
      await Promise.all(pollLoops)
      loopDelay.disable()
      return send({ kind: 'report', report: report() })
    case 'close':
      for (const s of sockets) s.disconnect()
      process.exit(0)
  }
}

process.on('message', (message: ToScreens) => {
  handle(message).catch(error => send({ kind: 'error', message: (error as Error).message }))
})
// The bench going away (Ctrl-C, a crash) ends this process too.
process.on('disconnect', () => process.exit(0))
process.on('SIGINT', () => { /* the bench sends 'close' or disconnects */ })
