// The bench's screens in processes of their own (scripts/lib/bench-screens-worker.ts): the
// board screens and polling screens split evenly over a few processes, each told what to do
// and asked for what it saw. In the scrutineers' process, 200 screens decoding every tile one
// after another made the last screen see it some 10 ms late and held up the scrutineers' next
// requests: the bench measured itself (`npm run bench` prints the screens' event-loop delay).
import { fork, type ChildProcess } from 'node:child_process'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'

export interface ScreensSetup {
  baseUrl: string
  competitionId: string
  /** Board screens (socket.io) of this process, by their index among all. */
  boards: { index: number, cookie: string }[]
  /** Polling screens of this process, by their index among all, each with its address. */
  pollers: { index: number, cookie: string, address: string }[]
  pollIntervalMs: number
}

/** What a screens process saw since it last told: [entry id|lastCheck.at, screen index, wall-clock ms]. */
export interface ScreensReport {
  push: [string, number, number][]
  poll: [string, number, number][]
  outOfOrder: number
  disconnects: number
  failures: string[]
  /** Its event loop's delay (p95, max) and its CPU time, from the start of the busy run. */
  loopDelayP95Ms: number
  loopDelayMaxMs: number
  cpuMs: number
  wallMs: number
}

export type ToScreens =
  | { kind: 'connect', setup: ScreensSetup }
  | { kind: 'poll-once' | 'busy' | 'report' | 'stop-polling' | 'close' }

export type FromScreens =
  | { kind: 'connected', boards: number }
  | { kind: 'polled' | 'busy' }
  | { kind: 'report', report: ScreensReport }
  | { kind: 'error', message: string }

const WORKER = join(fileURLToPath(new URL('.', import.meta.url)), 'bench-screens-worker.ts')

/** Deals `items` out to `n` hands, one each in turn. */
function deal<T>(items: readonly T[], n: number): T[][] {
  const hands: T[][] = Array.from({ length: n }, () => [])
  items.forEach((item, i) => hands[i % n]!.push(item))
  return hands
}

export class ScreenProcesses {
  private constructor(private readonly children: ChildProcess[]) {}

  /** Starts `n` processes and has them connect their screens (dealt out in turn). */
  static async start(n: number, all: Omit<ScreensSetup, 'boards' | 'pollers'> & { boards: string[], pollers: { cookie: string, address: string }[] }): Promise<ScreenProcesses> {
    // Each inherits this process' `--import tsx`.
    const children = Array.from({ length: n }, () => fork(WORKER, [], { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] }))
    const screens = new ScreenProcesses(children)
    const boards = deal(all.boards.map((cookie, index) => ({ index, cookie })), n)
    const pollers = deal(all.pollers.map((p, index) => ({ index, ...p })), n)
    try {
      await Promise.all(children.map((child, i) => screens.request(child, {
        kind: 'connect',
        setup: { baseUrl: all.baseUrl, competitionId: all.competitionId, pollIntervalMs: all.pollIntervalMs, boards: boards[i]!, pollers: pollers[i]! },
      })))
    }
    catch (error) {
      screens.close()
      throw error
    }
    return screens
  }

  private request(child: ChildProcess, message: ToScreens): Promise<FromScreens> {
    return new Promise((resolve, reject) => {
      const onMessage = (answer: FromScreens) => {
        done()
        if (answer.kind === 'error') reject(new Error(answer.message))
        else resolve(answer)
      }
      const onExit = (code: number | null) => {
        done()
        reject(new Error(`A screens process ended (exit code ${code}).`))
      }
      const done = () => {
        child.off('message', onMessage)
        child.off('exit', onExit)
      }
      child.on('message', onMessage)
      child.on('exit', onExit)
      child.send(message)
    })
  }

  /** Tells every process; resolves with each one's answer. */
  all(kind: 'poll-once' | 'busy' | 'report' | 'stop-polling'): Promise<FromScreens[]> {
    return Promise.all(this.children.map(child => this.request(child, { kind })))
  }

  /** What every process saw since it last told. */
  async reports(kind: 'report' | 'stop-polling' = 'report'): Promise<ScreensReport[]> {
    return (await this.all(kind)).map(a => (a as Extract<FromScreens, { kind: 'report' }>).report)
  }

  /** Closes the screens and ends the processes (also when they no longer answer). */
  close(): void {
    for (const child of this.children) {
      if (child.exitCode !== null || child.signalCode !== null) continue
      if (child.connected) child.send({ kind: 'close' } satisfies ToScreens, () => {})
      setTimeout(() => {
        if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL')
      }, 3000).unref()
    }
  }
}
