// The background jobs' timer (server/utils/interval-job.ts): the first run after its delay,
// then one per interval, never two at once, a failure logged and the next run made all the
// same, nothing at all with an interval of 0, and on close no further run and the one under
// way awaited.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { startIntervalJob } from '../../../../server/utils/interval-job'

function fakeApp() {
  let close: (() => Promise<void>) | undefined
  return { app: { hooks: { hook: (_: 'close', fn: () => Promise<void>) => { close = fn } } }, close: () => close?.() }
}

beforeEach(() => { vi.useFakeTimers() })
afterEach(() => { vi.useRealTimers(); vi.restoreAllMocks() })

describe('startIntervalJob', () => {
  it('runs first after its delay, then once per interval, one run at a time', async () => {
    const { app, close } = fakeApp()
    let runs = 0
    let finish: (() => void) | undefined
    startIntervalJob(app, { name: 'test job', intervalMs: 1000, firstAfterMs: 300, run: () => { runs++; return new Promise<void>((r) => { finish = r }) } })
    await vi.advanceTimersByTimeAsync(299)
    expect(runs).toBe(0)
    await vi.advanceTimersByTimeAsync(1)
    expect(runs).toBe(1)
    // Still running when the interval comes: not started twice.
    await vi.advanceTimersByTimeAsync(1000)
    expect(runs).toBe(1)
    finish!()
    await vi.advanceTimersByTimeAsync(1000)
    expect(runs).toBe(2)
    finish!()
    await close()
  })

  it('logs a failure and runs again at the next interval', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => {})
    const { app, close } = fakeApp()
    let runs = 0
    startIntervalJob(app, { name: 'test job', intervalMs: 1000, firstAfterMs: 0, run: async () => { runs++; throw new Error('the database went away') } })
    await vi.advanceTimersByTimeAsync(0)
    expect(warn).toHaveBeenCalledWith('[gridmark] test job: the database went away')
    await vi.advanceTimersByTimeAsync(1000)
    expect(runs).toBe(2)
    await close()
  })

  it('does nothing with an interval of 0', async () => {
    const { app } = fakeApp()
    const hook = vi.spyOn(app.hooks, 'hook')
    let runs = 0
    startIntervalJob(app, { name: 'test job', intervalMs: 0, firstAfterMs: 0, run: async () => { runs++ } })
    await vi.advanceTimersByTimeAsync(10_000)
    expect(runs).toBe(0)
    expect(hook).not.toHaveBeenCalled()
  })

  it('on close stops the timers and waits for the run under way', async () => {
    const { app, close } = fakeApp()
    let runs = 0
    let finish: (() => void) | undefined
    startIntervalJob(app, { name: 'test job', intervalMs: 1000, firstAfterMs: 0, run: () => { runs++; return new Promise<void>((r) => { finish = r }) } })
    await vi.advanceTimersByTimeAsync(0)
    let closed = false
    const closing = close()!.then(() => { closed = true })
    await vi.advanceTimersByTimeAsync(0)
    expect(closed).toBe(false)
    finish!()
    await closing
    expect(closed).toBe(true)
    await vi.advanceTimersByTimeAsync(5000)
    expect(runs).toBe(1)
  })
})
