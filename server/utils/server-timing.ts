// Server-Timing on an answer: where a request's time went, from its arrival (the instant kept
// by server/plugins/request-start.ts) through the marks the domain sets on its way — the
// board's lock taken, the work done, the commit, the push to the screens. The bench reads it to
// split a grid check's scan-to-board time (scripts/lib/bench-board.ts); a browser's network
// panel shows it. Durations only, plus the arrival on the server's wall clock (`start`), which
// the bench compares with its own (same machine).
import { AsyncLocalStorage } from 'node:async_hooks'
import { performance } from 'node:perf_hooks'
import { setResponseHeader, type H3Event } from 'h3'

/** Wall-clock milliseconds with sub-millisecond precision (the monotonic clock from the process' start). */
export function wallClockMs(): number {
  return performance.timeOrigin + performance.now()
}

/** Marks in the order they are set: [name, instant]. */
type Marks = [string, number][]

const current = new AsyncLocalStorage<Marks>()

/** Notes the request's arrival (server/plugins/request-start.ts). */
export function markRequestStart(event: H3Event): void {
  event.context.startedAt = wallClockMs()
}

/** Notes that the current request reached `name` (nothing outside `withServerTiming`). */
export function markTiming(name: string): void {
  current.getStore()?.push([name, wallClockMs()])
}

/** The header: each mark's time since the one before, then the arrival instant. */
export function serverTimingHeader(start: number, marks: Marks): string {
  let last = start
  const parts = marks.map(([name, at]) => {
    const dur = at - last
    last = at
    return `${name};dur=${dur.toFixed(3)}`
  })
  parts.push(`start;desc="${start.toFixed(3)}"`)
  return parts.join(', ')
}

/** Runs a route's work with its marks collected, then answers with them in Server-Timing. */
export async function withServerTiming<T>(event: H3Event, work: () => Promise<T>): Promise<T> {
  const marks: Marks = []
  try {
    return await current.run(marks, work)
  }
  finally {
    setResponseHeader(event, 'server-timing', serverTimingHeader((event.context.startedAt as number | undefined) ?? marks[0]?.[1] ?? wallClockMs(), marks))
  }
}
