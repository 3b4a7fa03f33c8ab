// The live board under load, for `npm run bench`: a throwaway PostgreSQL cluster (as `npm
// test` makes one), the built server, and the screens and phones of a busy morning on the
// grid — the phones in this process, the screens in processes of their own (bench-screens.ts).
//
//   latency    competition of 300 entries, today's day opened by its director. 200 board
//              screens on socket.io and 20 polling screens (GET …/board every 2 s, each at its
//              own phase) watch while 30 scrutineers each send a grid check every 4–8 s
//              (jittered; GRIDMARK_BENCH_PACE=stress: every 1–2 s) for 30 s. For each check:
//              from just before its POST to the moment each screen first shows the entry's
//              tile carrying that check (matched on entry id and `lastCheck.at` = the check's
//              `checkedAt`), on the wall clock all processes of the machine share. Where that
//              time went: the check's Server-Timing (arrival, auth, the board's lock, the
//              writes, commit, emit, the push to every screen) and the screens' own delay.
//              Before that, 20 checks one at a time show what a check costs with no queue
//              (reported apart, with the machine's load: other work shows in every figure).
//   snapshot   competition of 1,000 entries with its day open: GET …/board, the median of
//              30 sequential requests after a warm-up, timed here on loopback with node:http
//              and the body unzipped in one go (Node's fetch decodes gzip as a stream, some
//              3–4 ms slower for 400 KB), and where the time went (its Server-Timing: auth,
//              read, zip). The board does not change meanwhile, so the server sends the tiles
//              it read first (server/domain/board/snapshot.ts); the first read is printed too.
//
// Everything it started (screens, server, cluster, /tmp folder) is removed in every case,
// Ctrl-C included. The clients keep their work small: a tile event is noted by one set
// look-up; a polled board is parsed once and only changed tiles are looked at.
import { readFileSync } from 'node:fs'
import { Agent, get as httpGet, type IncomingHttpHeaders } from 'node:http'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import { randomBytes, randomUUID } from 'node:crypto'
import { availableParallelism, loadavg } from 'node:os'
import { gunzipSync } from 'node:zlib'
import knex from 'knex'
import { createKnexConfig } from '../../knexfile'
import type { BoardSnapshot } from '../../shared/types/api-board'
import { startServer } from '../../tests/support/server'
import { BENCH_PASSWORD, benchToday, createBenchCompetition, createBenchUsers, type BenchUser } from './bench-data'
import { startBenchDatabase, tearDownBench, type BenchParts } from './bench-services'
import { ensureBuild } from './build'
import { formatDuration, interrupts, ScriptError, step } from './common'
import { randomSessionPassword } from './secrets'
import { ScreenProcesses, type ScreensReport } from './bench-screens'

const BENCH_DATABASE = 'gridmark_bench'

export const BOARD_BENCH = {
  entries: 300,
  snapshotEntries: 1000,
  boardClients: 200,
  pollingClients: 20,
  scrutineers: 30,
  /**
   * The screens' processes (the board and polling screens dealt out in turn), one per core (at
   * most 4): a frame reaches every screen without 200 decodes queueing in one event loop, and
   * the screens stay off the phones' process. More processes than cores only add switching: on
   * this 2-core machine 4 processes took 25 % of the CPU against 13 % for 2, and a frame
   * reached the screens' p95 in 15–29 ms against 9–13 ms.
   */
  screenProcesses: Number(process.env.GRIDMARK_BENCH_SCREEN_PROCESSES) || Math.max(1, Math.min(4, availableParallelism())),
  /**
   * Each scrutineer waits 4–8 s (uniformly) between the end of one check and the start of the
   * next: about 5 checks a second from 30 scrutineers. A real grid check takes minutes (walk to
   * the glider, scan, six items, sometimes the scales), so this is some ten times the busiest
   * morning; GRIDMARK_BENCH_PACE=stress uses 1–2 s (about 19 a second) to see the overload.
   */
  checkGapMs: (process.env.GRIDMARK_BENCH_PACE === 'stress' ? [1000, 2000] : [4000, 8000]) as readonly [number, number],
  loadMs: 30_000,
  pollIntervalMs: 2000,
  /**
   * An entry is checked again only this long after its last check, so each check is its own
   * change on every screen: two checks of one glider in flight at once, or within one poll
   * interval, would show only the later. On the grid a glider is checked once a launch anyway.
   */
  entryCooldownMs: 5000,
  /** After the last check: how long pushed tiles may still arrive. */
  pushGraceMs: 5000,
  snapshotWarmUp: 5,
  snapshotRuns: 30,
} as const

export const TARGETS = { scanToBoardP95Ms: 25, pushVsPollRatio: 60, boardSnapshot1000Ms: 20 } as const

export interface BoardBenchResult {
  figures: { name: string, value: number, unit: string, digits: number }[]
  notes: string[]
  /** Submissions and samples taken, events lost. */
  counts: string[]
  /** Something went wrong in the measurement itself (lost events, failed checks). */
  failed: boolean
}

// ---------------------------------------------------------------------------------------
// Interrupts

const interruptWaiters = new Set<() => void>()
const signals = interrupts('stopping the bench', () => {
  for (const wake of interruptWaiters) wake()
})
const checkInterrupted = signals.check

/** Sleeps, but wakes at once on Ctrl-C. */
function pause(ms: number): Promise<void> {
  if (signals.signal) return Promise.resolve()
  return new Promise((resolve) => {
    const wake = () => {
      clearTimeout(timer)
      interruptWaiters.delete(wake)
      resolve()
    }
    const timer = setTimeout(wake, ms)
    interruptWaiters.add(wake)
  })
}

// ---------------------------------------------------------------------------------------
// Small HTTP client: a session cookie and an address of its own (the bench server trusts
// X-Forwarded-For, as it would behind a reverse proxy).

class BenchClient {
  cookie = ''
  readonly address: string
  constructor(readonly baseUrl: string) {
    const b = randomBytes(3)
    this.address = `10.${b[0]}.${b[1]}.${b[2]}`
  }

  headers(json = false): Record<string, string> {
    const h: Record<string, string> = { 'x-forwarded-for': this.address, 'accept': 'application/json' }
    if (this.cookie) h.cookie = this.cookie
    if (json) h['content-type'] = 'application/json'
    return h
  }

  async signIn(email: string): Promise<void> {
    const res = await fetch(`${this.baseUrl}/api/auth/login`, { method: 'POST', headers: this.headers(true), body: JSON.stringify({ email, password: BENCH_PASSWORD }) })
    const body = await res.text()
    if (res.status !== 200) throw new ScriptError(`Signing in ${email} failed: ${res.status} ${body}`)
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('gridmark-session='))
    if (!cookie) throw new ScriptError(`Signing in ${email} set no session cookie.`)
    this.cookie = cookie.split(';')[0]!
  }

  post(path: string, body: unknown): Promise<Response> {
    return fetch(this.baseUrl + path, { method: 'POST', headers: this.headers(true), body: JSON.stringify(body) })
  }

  get(path: string): Promise<Response> {
    return fetch(this.baseUrl + path, { headers: this.headers() })
  }
}

/** Runs `task` over `items` with at most `limit` at a time. */
async function inBatches<T, R>(items: readonly T[], limit: number, task: (item: T, index: number) => Promise<R>): Promise<R[]> {
  const out: R[] = new Array(items.length)
  let next = 0
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, async () => {
    while (next < items.length) {
      checkInterrupted()
      const i = next++
      out[i] = await task(items[i]!, i)
    }
  }))
  return out
}

async function signedIn(baseUrl: string, users: readonly BenchUser[]): Promise<BenchClient[]> {
  // Each sign-in hashes a password on the server: a few at a time keeps the set-up quick.
  return inBatches(users, 6, async (u) => {
    const client = new BenchClient(baseUrl)
    await client.signIn(u.email)
    return client
  })
}

// ---------------------------------------------------------------------------------------
// Statistics

function percentile(sorted: Float64Array, p: number): number {
  if (!sorted.length) return Number.NaN
  // Nearest rank: the smallest sample with at least p % of the samples at or below it.
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length))
  return sorted[rank - 1]!
}

function sortedSamples(xs: number[]): Float64Array {
  return Float64Array.from(xs).sort()
}

function median(xs: number[]): number {
  const s = sortedSamples(xs)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

// ---------------------------------------------------------------------------------------
// The latency run

/** The grid check's Server-Timing (server/utils/server-timing.ts): durations in ms, `start` on the server's wall clock. */
interface ServerTiming {
  start: number
  auth: number
  lock: number
  write: number
  commit: number
  emit: number
  push: number
}

function parseServerTiming(header: string | null): ServerTiming | undefined {
  if (!header) return undefined
  const t: Partial<ServerTiming> = {}
  for (const part of header.split(',')) {
    const [name, ...params] = part.trim().split(';')
    for (const p of params) {
      const [k, v] = p.split('=')
      if (k === 'dur' || k === 'desc') t[name as keyof ServerTiming] = Number(v!.replace(/"/g, ''))
    }
  }
  const keys: (keyof ServerTiming)[] = ['start', 'auth', 'lock', 'write', 'commit', 'emit', 'push']
  return keys.every(k => Number.isFinite(t[k])) ? t as ServerTiming : undefined
}

/** The instant the server began pushing a check to its screens, on its wall clock. */
const emitStartOf = (s: ServerTiming) => s.start + s.auth + s.lock + s.write + s.commit + s.emit

interface Submission {
  entryId: string
  /** Just before its POST, on the wall clock every process of the machine shares. */
  t0: number
  /** 201 once the server recorded it; anything else is a failed check. */
  status: number
  postMs: number
  /** Sent alone before the busy run (see `soloChecks`): counted apart. */
  solo: boolean
  server?: ServerTiming
  pushSeen: Uint8Array
  pollSeen: Uint8Array
}

interface Samples {
  push: number[]
  poll: number[]
  post: number[]
}

/** Where a busy check's time went, one sample per check (per check and screen for `emitToClient`). */
interface Breakdown {
  postToServer: number[]
  auth: number[]
  lock: number[]
  write: number[]
  commit: number[]
  serverToCommit: number[]
  commitToEmit: number[]
  emitLoop: number[]
  emitToClient: number[]
}

interface LatencyRun {
  submissions: Submission[]
  busy: Samples
  solo: Samples
  breakdown: Breakdown
  outOfOrder: number
  disconnects: number
  failures: string[]
  /** 1-minute load average of the machine when the busy run started and ended. */
  load: [number, number]
  /** CPU time over the busy run, in % of one core: the server, the scrutineers' process, the screens' processes. */
  cpu: { server: number, scrutineers: number, screens: number }
  /** The screens' processes: their number, and the worst event-loop delay among them (p95, max). */
  screens: { processes: number, loopDelayP95Ms: number, loopDelayMaxMs: number }
}

const SOLO_CHECKS = 20

const wallClockMs = () => performance.timeOrigin + performance.now()

/** CPU time (user + system) of a process so far, in ms; NaN where /proc cannot tell. */
function processCpuMs(pid: number): number {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100
  }
  catch {
    return Number.NaN
  }
}

async function latencyRun(opts: {
  baseUrl: string
  serverPid: number
  competitionId: string
  entryIds: readonly string[]
  day: string
  boardCookies: readonly string[]
  pollers: readonly BenchClient[]
  scrutineers: readonly BenchClient[]
  /** Set once the screens' processes run, so the caller can close them whatever happens. */
  started: (screens: ScreenProcesses) => void
}): Promise<LatencyRun> {
  const { competitionId, entryIds, day } = opts
  const nBoards = opts.boardCookies.length
  const nPollers = opts.pollers.length
  const base = `/api/competitions/${competitionId}`
  const run: LatencyRun = {
    submissions: [],
    busy: { push: [], poll: [], post: [] },
    solo: { push: [], poll: [], post: [] },
    breakdown: { postToServer: [], auth: [], lock: [], write: [], commit: [], serverToCommit: [], commitToEmit: [], emitLoop: [], emitToClient: [] },
    outOfOrder: 0,
    disconnects: 0,
    failures: [],
    load: [0, 0],
    cpu: { server: Number.NaN, scrutineers: Number.NaN, screens: Number.NaN },
    screens: { processes: BOARD_BENCH.screenProcesses, loopDelayP95Ms: 0, loopDelayMaxMs: 0 },
  }
  const byKey = new Map<string, Submission>()
  const samplesOf = (sub: Submission) => (sub.solo ? run.solo : run.busy)

  step(`Connecting ${nBoards} board screens and ${nPollers} polling screens in ${BOARD_BENCH.screenProcesses} process${BOARD_BENCH.screenProcesses === 1 ? '' : 'es'}`)
  const t0Connect = Date.now()
  const screens = await ScreenProcesses.start(BOARD_BENCH.screenProcesses, {
    baseUrl: opts.baseUrl,
    competitionId,
    pollIntervalMs: BOARD_BENCH.pollIntervalMs,
    boards: [...opts.boardCookies],
    pollers: opts.pollers.map(p => ({ cookie: p.cookie, address: p.address })),
  })
  opts.started(screens)
  console.log(`  ✓ ${nBoards} screens joined the board (${formatDuration(Date.now() - t0Connect)})`)

  /** Takes in what the screens saw: each screen's first sight of each check. */
  function absorb(reports: readonly ScreensReport[]): void {
    for (const r of reports) {
      run.outOfOrder += r.outOfOrder
      run.disconnects += r.disconnects
      run.failures.push(...r.failures)
      for (const [key, c, at] of r.push) {
        const sub = byKey.get(key)
        if (!sub || sub.pushSeen[c]) continue
        sub.pushSeen[c] = 1
        samplesOf(sub).push.push(at - sub.t0)
        if (!sub.solo && sub.server) run.breakdown.emitToClient.push(at - emitStartOf(sub.server))
      }
      for (const [key, p, at] of r.poll) {
        const sub = byKey.get(key)
        if (!sub || sub.solo || sub.pollSeen[p]) continue
        sub.pollSeen[p] = 1
        run.busy.poll.push(at - sub.t0)
      }
    }
  }

  // One grid check: registered under its key before it is sent (a push may beat the answer).
  const lastChecked = new Float64Array(entryIds.length).fill(-Infinity)
  const busy = new Uint8Array(entryIds.length)
  async function submit(client: BenchClient, i: number, solo: boolean): Promise<void> {
    busy[i] = 1
    const entryId = entryIds[i]!
    const checkedAt = new Date().toISOString()
    const body = {
      idempotencyKey: randomUUID(),
      entryId,
      day,
      checkedAt,
      answers: [
        { itemId: 'cwu-operating', result: 'pass' },
        { itemId: 'cwu-firmware', result: 'pass' },
        { itemId: 'antennas', result: 'pass', note: 'Both fitted' },
      ],
      notes: 'Dry wings',
      foundBy: 'scan',
    }
    const sub: Submission = { entryId, t0: 0, status: 0, postMs: 0, solo, pushSeen: new Uint8Array(nBoards), pollSeen: new Uint8Array(nPollers) }
    byKey.set(`${entryId}|${checkedAt}`, sub)
    run.submissions.push(sub)
    sub.t0 = wallClockMs()
    try {
      const res = await client.post(`${base}/grid-checks`, body)
      sub.status = res.status
      if (res.status !== 201) run.failures.push(`a grid check answered ${res.status}: ${await res.text()}`)
      else await res.arrayBuffer()
      sub.server = parseServerTiming(res.headers.get('server-timing'))
    }
    catch (error) {
      run.failures.push(`a grid check failed: ${(error as Error).message}`)
    }
    sub.postMs = wallClockMs() - sub.t0
    samplesOf(sub).post.push(sub.postMs)
    const s = sub.server
    if (!solo && s && sub.status === 201) {
      const b = run.breakdown
      b.postToServer.push(s.start - sub.t0)
      b.auth.push(s.auth)
      b.lock.push(s.lock)
      b.write.push(s.write)
      b.commit.push(s.commit)
      b.serverToCommit.push(s.auth + s.lock + s.write + s.commit)
      b.commitToEmit.push(s.emit)
      b.emitLoop.push(s.push)
    }
    lastChecked[i] = performance.now()
    busy[i] = 0
  }
  const pickEntry = (): number | null => {
    const now = performance.now()
    for (let tries = 0; tries < 50; tries++) {
      const i = Math.floor(Math.random() * entryIds.length)
      if (!busy[i] && now - lastChecked[i]! >= BOARD_BENCH.entryCooldownMs) return i
    }
    return null
  }

  // First a few checks one at a time, nothing else going on: what one check costs, before
  // any queue forms. Reported apart from the figures.
  step(`${SOLO_CHECKS} grid checks one at a time`)
  for (let n = 0; n < SOLO_CHECKS && !signals.signal; n++) {
    const i = pickEntry()
    if (i !== null) await submit(opts.scrutineers[n % opts.scrutineers.length]!, i, true)
    await pause(150)
  }

  // Each polling screen has seen the board as it stood before the busy run.
  await screens.all('poll-once')

  step(`${opts.scrutineers.length} scrutineers checking for ${BOARD_BENCH.loadMs / 1000} s; ${nBoards} screens pushed to, ${nPollers} polling`)
  run.load[0] = loadavg()[0]!
  await screens.all('busy')
  const cpuAtStart = { server: processCpuMs(opts.serverPid), scrutineers: process.cpuUsage(), wall: performance.now() }
  const loadEnds = performance.now() + BOARD_BENCH.loadMs
  const [gapMin, gapMax] = BOARD_BENCH.checkGapMs
  const scrutineers = opts.scrutineers.map(async (client) => {
    // Start spread over the first gap, as phones come onto the grid one by one.
    await pause(Math.random() * gapMax)
    while (performance.now() < loadEnds && !signals.signal) {
      const i = pickEntry()
      if (i !== null) await submit(client, i, false)
      await pause(gapMin + Math.random() * (gapMax - gapMin))
    }
  })
  await Promise.all(scrutineers)
  run.load[1] = loadavg()[0]!
  const busyWallMs = performance.now() - cpuAtStart.wall
  const mainCpu = process.cpuUsage(cpuAtStart.scrutineers)
  run.cpu.server = (100 * (processCpuMs(opts.serverPid) - cpuAtStart.server)) / busyWallMs
  run.cpu.scrutineers = (100 * (mainCpu.user + mainCpu.system) / 1000) / busyWallMs

  // Stragglers: pushed tiles may still be on their way, and every polling screen polls twice
  // more, so a check that never shows counts as lost rather than late.
  const loadDone = performance.now()
  const recorded = run.submissions.filter(s => s.status === 201)
  for (;;) {
    absorb(await screens.reports())
    if (signals.signal || performance.now() >= loadDone + BOARD_BENCH.pushGraceMs || !recorded.some(s => s.pushSeen.includes(0))) break
    await pause(100)
  }
  await pause(loadDone + 2 * BOARD_BENCH.pollIntervalMs + 500 - performance.now())
  const last = await screens.reports('stop-polling')
  absorb(last)
  // The screens' CPU over the busy run and the grace after it, in % of one core each added up.
  run.cpu.screens = last.reduce((sum, r) => sum + (100 * r.cpuMs) / r.wallMs, 0)
  run.screens.loopDelayP95Ms = Math.max(...last.map(r => r.loopDelayP95Ms))
  run.screens.loopDelayMaxMs = Math.max(...last.map(r => r.loopDelayMaxMs))
  return run
}

// ---------------------------------------------------------------------------------------
// The snapshot run

/** GET …/board's time, and where it went (its Server-Timing: auth, read, zip), as medians. */
interface SnapshotRun {
  ms: number
  /** The first read, of tiles the server had not read yet (server/domain/board/snapshot.ts keeps them until the board changes). */
  firstMs: number
  tiles: number
  parts: { auth: number, read: number, zip: number } | undefined
}

/**
 * One GET as a screen's browser makes it: the answer's bytes, unzipped in one go. Node's fetch
 * decodes gzip as a stream: a bare server's 400 KB answer took 8–9 ms by fetch on this machine
 * against 5 ms this way, time the figure would count as the board's.
 */
function plainGet(client: BenchClient, path: string, agent: Agent): Promise<{ status: number, headers: IncomingHttpHeaders, body: Buffer }> {
  return new Promise((resolve, reject) => {
    httpGet(client.baseUrl + path, { agent, headers: { ...client.headers(), 'accept-encoding': 'gzip' } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', () => {
        const raw = Buffer.concat(chunks)
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: res.headers['content-encoding'] === 'gzip' ? gunzipSync(raw) : raw })
      })
      res.on('error', reject)
    }).on('error', reject)
  })
}

async function snapshotRun(director: BenchClient, competitionId: string): Promise<SnapshotRun> {
  const path = `/api/competitions/${competitionId}/board`
  const agent = new Agent({ keepAlive: true, maxSockets: 1 })
  let tiles = 0
  let firstMs = 0
  const times: number[] = []
  const parts: Record<'auth' | 'read' | 'zip', number[]> = { auth: [], read: [], zip: [] }
  try {
    for (let i = 0; i < BOARD_BENCH.snapshotWarmUp; i++) {
      const t0 = performance.now()
      const res = await plainGet(director, path, agent)
      if (i === 0) firstMs = performance.now() - t0
      if (res.status !== 200) throw new ScriptError(`GET ${path} answered ${res.status}: ${res.body.toString('utf8')}`)
      tiles = (JSON.parse(res.body.toString('utf8')) as BoardSnapshot).tiles.length
    }
    for (let i = 0; i < BOARD_BENCH.snapshotRuns; i++) {
      checkInterrupted()
      const t0 = performance.now()
      const res = await plainGet(director, path, agent)
      times.push(performance.now() - t0)
      if (res.status !== 200) throw new ScriptError(`GET ${path} answered ${res.status}`)
      for (const part of String(res.headers['server-timing'] ?? '').split(',')) {
        const [name, dur] = part.trim().split(';dur=')
        if (name && name in parts && dur) parts[name as keyof typeof parts].push(Number(dur))
      }
    }
  }
  finally {
    agent.destroy()
  }
  const complete = Object.values(parts).every(xs => xs.length === times.length)
  return {
    ms: median(times),
    firstMs,
    tiles,
    parts: complete ? { auth: median(parts.auth), read: median(parts.read), zip: median(parts.zip) } : undefined,
  }
}

// ---------------------------------------------------------------------------------------
// Set-up, run, tear-down

const timed = signals.timed

async function openDay(director: BenchClient, competitionId: string): Promise<string> {
  const res = await director.post(`/api/competitions/${competitionId}/days`, { kind: 'practice' })
  const body = await res.json() as { day?: { day: string }, message?: string }
  if (res.status !== 201 || !body.day) throw new ScriptError(`Opening the day answered ${res.status}: ${JSON.stringify(body)}`)
  return body.day.day
}

export async function benchBoard(): Promise<BoardBenchResult> {
  signals.listen()

  const parts: BenchParts = {}
  let screens: ScreenProcesses | undefined

  try {
    step('Live board: a throwaway database and the built server')
    const url = await startBenchDatabase(parts, 'gridmark-bench-', BENCH_DATABASE, timed)
    await timed('build', ensureBuild)

    const today = benchToday()
    const data = await timed(`bench data: ${BOARD_BENCH.entries} + ${BOARD_BENCH.snapshotEntries} entries, staff accounts`, async () => {
      const k = knex(createKnexConfig(url))
      try {
        const [director] = await createBenchUsers(k, 'director', 1, () => 'Dana Fallowby')
        const scrutineers = await createBenchUsers(k, 'scrutineer', BOARD_BENCH.scrutineers, i => `Scrutineer ${i + 1} Greyling`)
        const boards = await createBenchUsers(k, 'board', BOARD_BENCH.boardClients, i => `Board Screen ${i + 1}`)
        const pollers = await createBenchUsers(k, 'poller', BOARD_BENCH.pollingClients, i => `Polling Screen ${i + 1}`)
        const staff = [
          { userId: director!.id, role: 'director' as const },
          ...scrutineers.map(u => ({ userId: u.id, role: 'scrutineer' as const })),
          ...[...boards, ...pollers].map(u => ({ userId: u.id, role: 'organiser' as const })),
        ]
        const live = await createBenchCompetition(k, { name: 'Larkrise Down Open', slug: 'bench-live', entries: BOARD_BENCH.entries, today, staff })
        const large = await createBenchCompetition(k, { name: 'Larkrise Down Nationals', slug: 'bench-large', entries: BOARD_BENCH.snapshotEntries, today, staff: [{ userId: director!.id, role: 'director' }] })
        return { director: director!, scrutineers, boards, pollers, live, large }
      }
      finally {
        await k.destroy()
      }
    })

    const sessionSecret = randomSessionPassword()
    const server = parts.server = await timed('bench server started', () => {
      // startServer hands its own environment on to the server, with these on top.
      process.env.DATABASE_URL = url
      return startServer({
        NUXT_SESSION_PASSWORD: sessionSecret,
        NUXT_UPLOADS_DIR: join(parts.tempDir!, 'uploads'),
        // Every screen and phone signs in once, each from its own address; successful
        // sign-ins never count against a limit.
      })
    })
    const baseUrl = server.url

    const signIns = 1 + data.scrutineers.length + data.boards.length + data.pollers.length
    const [director, scrutineers, boards, pollers] = await timed(`${signIns} sign-ins`, async () => [
      (await signedIn(baseUrl, [data.director]))[0]!,
      await signedIn(baseUrl, data.scrutineers),
      await signedIn(baseUrl, data.boards),
      await signedIn(baseUrl, data.pollers),
    ] as const)

    const day = await timed(`day opened, ${BOARD_BENCH.entries} tiles`, () => openDay(director, data.live.id))
    const run = await latencyRun({
      baseUrl,
      competitionId: data.live.id,
      entryIds: data.live.entryIds,
      day,
      serverPid: server.pid,
      boardCookies: boards.map(b => b.cookie),
      pollers,
      scrutineers,
      started: (s) => {
        screens = s
      },
    })
    checkInterrupted()
    screens?.close()

    await timed(`day opened, ${BOARD_BENCH.snapshotEntries} tiles`, () => openDay(director, data.large.id))
    step(`Timing GET …/board on ${BOARD_BENCH.snapshotEntries} entries`)
    const snapshot = await snapshotRun(director, data.large.id)
    if (snapshot.tiles !== BOARD_BENCH.snapshotEntries) throw new ScriptError(`The board of ${BOARD_BENCH.snapshotEntries} entries showed ${snapshot.tiles} tiles.`)

    return summarise(run, snapshot, boards.length, pollers.length)
  }
  finally {
    screens?.close()
    await tearDownBench(parts)
    signals.release()
  }
}

/** Whether the bench was stopped by a signal (the caller exits 130). */
export function benchInterrupted(): NodeJS.Signals | undefined {
  return signals.signal
}

function summarise(run: LatencyRun, snapshot: SnapshotRun, nBoards: number, nPollers: number): BoardBenchResult {
  const snapshotMs = snapshot.ms
  const recorded = run.submissions.filter(s => s.status === 201)
  const busyRecorded = recorded.filter(s => !s.solo)
  let lostPush = 0
  let lostPoll = 0
  for (const s of recorded) {
    for (const seen of s.pushSeen) if (!seen) lostPush++
    if (!s.solo) for (const seen of s.pollSeen) if (!seen) lostPoll++
  }
  const push = sortedSamples(run.busy.push)
  const poll = sortedSamples(run.busy.poll)
  const post = sortedSamples(run.busy.post)
  const soloPush = sortedSamples(run.solo.push)
  const soloPost = sortedSamples(run.solo.post)
  const p95 = percentile(push, 95)
  const pollP95 = percentile(poll, 95)
  const figures = [
    { name: 'scan_to_board_p50_ms', value: percentile(push, 50), unit: 'ms', digits: 1 },
    { name: 'scan_to_board_p95_ms', value: p95, unit: 'ms', digits: 1 },
    { name: 'scan_to_board_p99_ms', value: percentile(push, 99), unit: 'ms', digits: 1 },
    { name: 'polling_board_p95_ms', value: pollP95, unit: 'ms', digits: 1 },
    { name: 'push_vs_poll_ratio', value: pollP95 / p95, unit: 'x', digits: 1 },
    { name: 'board_snapshot_1000_ms', value: snapshotMs, unit: 'ms', digits: 1 },
    ...breakdownFigures(run),
  ]
  const notes: string[] = []
  if (!(p95 <= TARGETS.scanToBoardP95Ms)) notes.push(`note: scan_to_board_p95_ms is ${p95.toFixed(1)} ms, above its target of ${TARGETS.scanToBoardP95Ms} ms`)
  if (!(pollP95 / p95 >= TARGETS.pushVsPollRatio)) notes.push(`note: push_vs_poll_ratio is ${(pollP95 / p95).toFixed(1)}, below its target of ${TARGETS.pushVsPollRatio}`)
  if (!(snapshotMs <= TARGETS.boardSnapshot1000Ms)) notes.push(`note: board_snapshot_1000_ms is ${snapshotMs.toFixed(1)} ms, above its target of ${TARGETS.boardSnapshot1000Ms} ms`)
  if (lostPush > 0 || lostPoll > 0) notes.push('note: lost events must be 0')
  const ms = (x: number) => `${x.toFixed(1)} ms`
  const counts = [
    `board bench: ${busyRecorded.length} of ${run.submissions.length - SOLO_CHECKS} grid checks recorded, sent by ${BOARD_BENCH.scrutineers} scrutineers in ${BOARD_BENCH.loadMs / 1000} s `
    + `(each every ${BOARD_BENCH.checkGapMs[0] / 1000}–${BOARD_BENCH.checkGapMs[1] / 1000} s); `
    + `their POST p50 ${ms(percentile(post, 50))}, p95 ${ms(percentile(post, 95))}`,
    `board bench: ${push.length} push samples (${nBoards} screens), ${poll.length} polling samples (${nPollers} screens every ${BOARD_BENCH.pollIntervalMs / 1000} s)`,
    `board bench: lost events: ${lostPush} pushed, ${lostPoll} polled; tile events out of order: ${run.outOfOrder}; screens dropped: ${run.disconnects}`,
    `board bench: before that, ${soloPost.length} checks one at a time: POST p50 ${ms(percentile(soloPost, 50))}, on the boards p50 ${ms(percentile(soloPush, 50))}, p95 ${ms(percentile(soloPush, 95))}`,
    `board bench: machine load (1-minute average, ${availableParallelism()} cores): ${run.load[0].toFixed(1)} when the busy run began, ${run.load[1].toFixed(1)} when it ended`,
    snapshot.parts
      ? `board bench: GET …/board of ${snapshot.tiles} tiles, median of each part: auth ${ms(snapshot.parts.auth)}, read ${ms(snapshot.parts.read)}, zip ${ms(snapshot.parts.zip)}; `
      + `the rest (the request's way, sending, the bench's unzip in one go) ${ms(snapshotMs - snapshot.parts.auth - snapshot.parts.read - snapshot.parts.zip)}; `
      + `the first read, its tiles from the database, ${ms(snapshot.firstMs)}`
      : 'board bench: GET …/board sent no complete Server-Timing',
    `board bench: screens in ${run.screens.processes} process${run.screens.processes === 1 ? '' : 'es'}; their event loops' worst delay p95 ${ms(run.screens.loopDelayP95Ms)}, max ${ms(run.screens.loopDelayMaxMs)}`,
  ]
  const failed = lostPush > 0 || lostPoll > 0 || run.failures.length > 0 || recorded.length === 0 || run.disconnects > 0
  if (run.failures.length) {
    const distinct = [...new Set(run.failures)]
    counts.push(`board bench: ${run.failures.length} failed requests, e.g. ${distinct.slice(0, 3).join(' | ')}`)
  }
  return { figures, notes, counts, failed }
}

/**
 * Where the busy run's time went, as p50 and p95 of each part: the bench's POST reaching the
 * server, the server to the commit (auth, the board's lock, the writes, the commit itself),
 * commit to emit, the server's loop writing the tile to every screen, emit to a screen's
 * handler; then the CPU of each side and the screens' event-loop delay.
 */
function breakdownFigures(run: LatencyRun): BoardBenchResult['figures'] {
  const b = run.breakdown
  const parts: [string, number[]][] = [
    ['scan_post_to_server', b.postToServer],
    ['scan_server_to_commit', b.serverToCommit],
    ['scan_server_auth', b.auth],
    ['scan_server_lock', b.lock],
    ['scan_server_write', b.write],
    ['scan_server_commit', b.commit],
    ['scan_commit_to_emit', b.commitToEmit],
    ['scan_emit_loop', b.emitLoop],
    ['scan_emit_to_client', b.emitToClient],
  ]
  const figures: BoardBenchResult['figures'] = []
  for (const [name, xs] of parts) {
    const sorted = sortedSamples(xs)
    figures.push({ name: `${name}_p50_ms`, value: percentile(sorted, 50), unit: 'ms', digits: 2 })
    figures.push({ name: `${name}_p95_ms`, value: percentile(sorted, 95), unit: 'ms', digits: 2 })
  }
  figures.push(
    { name: 'bench_screens_loop_delay_p95_ms', value: run.screens.loopDelayP95Ms, unit: 'ms', digits: 2 },
    { name: 'cpu_server_pct', value: run.cpu.server, unit: '%', digits: 0 },
    { name: 'cpu_bench_scrutineers_pct', value: run.cpu.scrutineers, unit: '%', digits: 0 },
    { name: 'cpu_bench_screens_pct', value: run.cpu.screens, unit: '%', digits: 0 },
  )
  return figures
}
