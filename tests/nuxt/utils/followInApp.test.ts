import { describe, expect, it } from 'vitest'
import { followInApp } from '~/utils/followInApp'

// A plain link followed within the app: a plain click navigates in place (the router's route
// changes, the page is not loaded anew); a click asking for another tab or window is left alone.
function click(init: MouseEventInit = {}): MouseEvent {
  return new MouseEvent('click', { button: 0, cancelable: true, ...init })
}

describe('followInApp', () => {
  it('takes a plain click within the app', async () => {
    const event = click()
    followInApp(event, '/privacy?from=list')
    expect(event.defaultPrevented).toBe(true)
    await expect.poll(() => useRouter().currentRoute.value.fullPath).toBe('/privacy?from=list')
  })

  it('leaves a click with a modifier or another button to the browser', () => {
    for (const init of [{ ctrlKey: true }, { metaKey: true }, { shiftKey: true }, { altKey: true }, { button: 1 }]) {
      const event = click(init)
      followInApp(event, '/privacy')
      expect(event.defaultPrevented, JSON.stringify(init)).toBe(false)
    }
  })
})
