// The outbox worker's retry delays: doubling from the base, never past the cap.
import { describe, expect, it } from 'vitest'
import { backoffMs } from '#domain/mail/transport'

describe('backoffMs', () => {
  it('doubles from the base after each failed attempt', () => {
    expect([1, 2, 3, 4].map(a => backoffMs(a, 1000, 60_000))).toEqual([1000, 2000, 4000, 8000])
  })

  it('stops at the cap, even after very many attempts', () => {
    expect(backoffMs(7, 1000, 4000)).toBe(4000)
    expect(backoffMs(10_000, 30_000, 3_600_000)).toBe(3_600_000)
  })

  it('treats a first or unknown attempt count as the base delay', () => {
    expect(backoffMs(0, 500, 10_000)).toBe(500)
    expect(backoffMs(-3, 500, 10_000)).toBe(500)
  })
})
