// Server-Timing: each mark's time since the one before, in the order set, then the arrival
// instant; marks set outside a timed route go nowhere.
import { describe, expect, it } from 'vitest'
import { markTiming, serverTimingHeader, wallClockMs } from '../../../../server/utils/server-timing'

describe('the Server-Timing header', () => {
  it('gives each mark the time since the one before, then the arrival on the wall clock', () => {
    const start = 1_800_000_000_000.125
    expect(serverTimingHeader(start, [['auth', start + 1.5], ['lock', start + 1.75], ['commit', start + 6]]))
      .toBe('auth;dur=1.500, lock;dur=0.250, commit;dur=4.250, start;desc="1800000000000.125"')
  })

  it('still names the arrival when no mark was set', () => {
    expect(serverTimingHeader(12.5, [])).toBe('start;desc="12.500"')
  })

  it('ignores a mark outside a timed request', () => {
    expect(() => markTiming('commit')).not.toThrow()
  })

  it('reads the wall clock with sub-millisecond precision, close to Date.now()', () => {
    const now = wallClockMs()
    expect(Math.abs(now - Date.now())).toBeLessThan(50)
    expect(Number.isInteger(now) && Number.isInteger(wallClockMs())).toBe(false)
  })
})
