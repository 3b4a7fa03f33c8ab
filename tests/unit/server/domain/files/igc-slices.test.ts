// An uploaded IGC file (up to 5 MB, a couple of seconds of parsing) is parsed in slices that
// give the event loop back: the result is the parse's own, and timers keep firing meanwhile.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { parseIgc, parseIgcInSlices } from '#domain/files/igc-header'

const fixture = readFileSync(new URL('../../../../fixtures/igc/valid-declaration.igc', import.meta.url), 'latin1')

/** The fixture's header and a day's worth of fixes, one a second, up to about `bytes`. */
function longFlight(bytes: number): string {
  const lines = fixture.split('\n').filter(l => l && !l.startsWith('B') && !l.startsWith('G'))
  let size = lines.join('\n').length
  for (let t = 10 * 3600; size < bytes; t++) {
    const hh = String(Math.floor(t / 3600) % 24).padStart(2, '0')
    const mm = String(Math.floor(t / 60) % 60).padStart(2, '0')
    const ss = String(t % 60).padStart(2, '0')
    const line = `B${hh}${mm}${ss}5130000N00745000EA0050000600`
    lines.push(line)
    size += line.length + 2
  }
  lines.push('G3F2A91C07B44D1E8A5F60C2B9137E4D')
  return lines.join('\r\n')
}

describe('parseIgcInSlices', () => {
  it('gives the same result as the parse in one go', async () => {
    expect(await parseIgcInSlices(fixture)).toEqual(parseIgc(fixture))
    const garbage = 'not an igc file\n'.repeat(2000)
    expect(await parseIgcInSlices(garbage)).toEqual(parseIgc(garbage))
  })

  it('parses a 4.5 MB flight while a 5 ms timer goes on firing, never held up 100 ms', async () => {
    const text = longFlight(4.5 * 1024 * 1024)
    let last = performance.now()
    let longestGap = 0
    let ticks = 0
    const timer = setInterval(() => {
      const now = performance.now()
      longestGap = Math.max(longestGap, now - last)
      last = now
      ticks++
    }, 5)
    const started = performance.now()
    const result = await parseIgcInSlices(text).finally(() => clearInterval(timer))
    const took = performance.now() - started
    expect(result.ok).toBe(true)
    if (result.ok) expect(result.header).toMatchObject({ pilot: 'Marit Dovecote', gliderId: 'D-KMOR', hasGRecord: true })
    // The parse took long enough that a blocking one would have stalled the timer throughout.
    expect(took).toBeGreaterThan(100)
    expect(ticks).toBeGreaterThan(5)
    expect(longestGap).toBeLessThan(100)
  }, 60_000)
})
