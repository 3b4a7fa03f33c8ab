// The app waits one frame before hydrating, so the browser paints the server's HTML first;
// a hidden tab (no frames) starts on a timer; a page the app renders itself does not wait.
import { afterEach, describe, expect, it, vi } from 'vitest'
import type { NuxtApp } from '#app'
import paintFirst from '~/plugins/00.paint-first.client'

let frame: FrameRequestCallback | undefined
afterEach(() => {
  vi.useRealTimers()
  vi.unstubAllGlobals()
  frame = undefined
})

function started(nuxtApp: Partial<NuxtApp>) {
  vi.stubGlobal('requestAnimationFrame', (cb: FrameRequestCallback) => {
    frame = cb
    return 1
  })
  vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
  const state = { done: false }
  void Promise.resolve(paintFirst(nuxtApp as NuxtApp)).then(() => { state.done = true })
  return state
}

describe('paint first', () => {
  it('hydrates once the next frame has been painted', async () => {
    const app = started({ isHydrating: true })
    await vi.advanceTimersByTimeAsync(50)
    expect(app.done).toBe(false)
    frame!(performance.now())
    await vi.advanceTimersByTimeAsync(0)
    expect(app.done).toBe(true)
  })

  it('starts on its timer where no frame comes (a hidden tab)', async () => {
    const app = started({ isHydrating: true })
    await vi.advanceTimersByTimeAsync(99)
    expect(app.done).toBe(false)
    await vi.advanceTimersByTimeAsync(1)
    expect(app.done).toBe(true)
  })

  it('does not wait when there is nothing of the server’s to paint', async () => {
    const app = started({ isHydrating: false })
    await vi.advanceTimersByTimeAsync(0)
    expect(app.done).toBe(true)
    expect(frame).toBeUndefined()
  })
})
