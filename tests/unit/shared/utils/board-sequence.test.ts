// A board screen applies pushed changes in the order of their sequence numbers, ignores what
// its snapshot already holds, waits behind a missing number and catches up after a refetch.
import { describe, expect, it } from 'vitest'
import { hasGap, offer, rebase, sequenceState } from '#shared/utils/board-sequence'

const ev = (seq: number) => ({ seq, id: `e${seq}` })

describe('offer', () => {
  it('applies the next number and ignores what the snapshot already holds', () => {
    const s = sequenceState<ReturnType<typeof ev>>(10)
    expect(offer(s, ev(9))).toEqual({ kind: 'stale' })
    expect(offer(s, ev(10))).toEqual({ kind: 'stale' })
    expect(offer(s, ev(11))).toEqual({ kind: 'apply', events: [ev(11)] })
    expect(s.seq).toBe(11)
  })

  it('holds back a change that arrives ahead of a missing one, and applies both in order when it comes', () => {
    const s = sequenceState<ReturnType<typeof ev>>(10)
    expect(offer(s, ev(12))).toEqual({ kind: 'gap', missing: 11 })
    expect(offer(s, ev(13))).toEqual({ kind: 'gap', missing: 11 })
    expect(hasGap(s)).toBe(true)
    expect(offer(s, ev(11))).toEqual({ kind: 'apply', events: [ev(11), ev(12), ev(13)] })
    expect(s.seq).toBe(13)
    expect(hasGap(s)).toBe(false)
  })
})

describe('rebase', () => {
  it('after a fresh snapshot drops what it holds and returns what follows it, in order', () => {
    const s = sequenceState<ReturnType<typeof ev>>(10)
    offer(s, ev(12))
    offer(s, ev(14))
    offer(s, ev(15))
    // The snapshot fetched because 11 went missing already includes 12 and 13.
    expect(rebase(s, 13)).toEqual([ev(14), ev(15)])
    expect(s.seq).toBe(15)
    expect(hasGap(s)).toBe(false)
  })

  it('keeps waiting when a number is still missing after the snapshot', () => {
    const s = sequenceState<ReturnType<typeof ev>>(10)
    offer(s, ev(14))
    expect(rebase(s, 12)).toEqual([])
    expect(s.seq).toBe(12)
    expect(hasGap(s)).toBe(true)
  })
})
