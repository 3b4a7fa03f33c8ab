// A background job on a timer, as the reminder and retention plugins run theirs: a first run
// shortly after the server starts (once migrations had their chance), then one every
// `intervalMs` (0 or less: never, as the tests set it, triggering the job through its admin
// route instead). One run at a time — a run still going when the next is due is not doubled;
// a failure is logged, never thrown; on close the timers stop and a run under way is awaited.

/** What the plugin hands in: only its `close` hook is used. */
export interface ClosingApp {
  hooks: { hook: (name: 'close', fn: () => Promise<void>) => unknown }
}

export interface IntervalJob {
  /** Said in the log line of a failure: `[gridmark] <name>: <message>`. */
  name: string
  intervalMs: number
  firstAfterMs: number
  run: () => Promise<void>
}

export function startIntervalJob(app: ClosingApp, job: IntervalJob): void {
  if (!(job.intervalMs > 0)) return
  let running: Promise<void> | undefined
  const run = () => {
    if (running) return
    running = job.run()
      .catch((error) => { console.warn(`[gridmark] ${job.name}: ${(error as Error).message}`) })
      .finally(() => { running = undefined })
  }
  const first = setTimeout(run, job.firstAfterMs)
  const timer = setInterval(run, job.intervalMs)
  app.hooks.hook('close', async () => {
    clearTimeout(first)
    clearInterval(timer)
    await running
  })
}
