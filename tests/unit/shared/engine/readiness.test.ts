import { describe, expect, it } from 'vitest'
import { applyWaivers, readiness, type DirectorAction } from '#shared/engine/readiness'
import type { Finding } from '#shared/engine/types'

const DAY = '2027-07-13'
const blocking: Finding = { checkId: 'entry.paid', severity: 'blocking', reason: 'unpaid', fixHint: 'pay', subject: 'payment' }
const advisory: Finding = { checkId: 'firmware.expires-soon', severity: 'advisory', reason: 'soon', fixHint: 'update', unitId: 'cw-1' }
const checked = { day: DAY, outcome: 'pass' as const }

describe('readiness (DESIGN.md, vocabulary)', () => {
  it('is unchecked without a grid check today, ready once checked with nothing open', () => {
    expect(readiness([], null, [], DAY)).toBe('unchecked')
    expect(readiness([], { day: '2027-07-12', outcome: 'pass' }, [], DAY)).toBe('unchecked')
    expect(readiness([], checked, [], DAY)).toBe('ready')
  })

  it('is caution when only advisory findings remain', () => {
    expect(readiness([advisory], checked, [], DAY)).toBe('caution')
    expect(readiness([advisory], null, [], DAY)).toBe('unchecked')
  })

  it('is held for a blocking finding once grid-checked; before the check the day starts unchecked', () => {
    // DESIGN.md, main flow 3: the director opens the day and every entry shows unchecked;
    // the standing finding carries over and is shown beside it.
    expect(readiness([blocking], checked, [], DAY)).toBe('held')
    expect(readiness([blocking], null, [], DAY)).toBe('unchecked')
    expect(readiness([blocking], { day: '2027-07-12', outcome: 'pass' }, [], DAY)).toBe('unchecked')
  })

  it('is held before any check when the director holds the glider', () => {
    expect(readiness([], null, [{ kind: 'hold', day: DAY, reason: 'tow hook' }], DAY)).toBe('held')
  })

  it('is held after a failed grid check', () => {
    expect(readiness([], { day: DAY, outcome: 'fail' }, [], DAY)).toBe('held')
  })

  it('lets a waiver for the day suppress its finding, and only that day', () => {
    const waiver: DirectorAction = { kind: 'waiver', day: DAY, checkId: 'entry.paid', reason: 'paid in cash at the office' }
    expect(readiness([blocking], checked, [waiver], DAY)).toBe('ready')
    expect(readiness([blocking], { day: '2027-07-14', outcome: 'pass' }, [waiver], '2027-07-14')).toBe('held')
  })

  it('lets a competition-wide waiver (day null) count every day', () => {
    const waiver: DirectorAction = { kind: 'waiver', day: null, checkId: 'entry.paid' }
    expect(readiness([blocking], checked, [waiver], DAY)).toBe('ready')
  })

  it('narrows a waiver to its unit', () => {
    const other: DirectorAction = { kind: 'waiver', day: DAY, checkId: 'firmware.expires-soon', unitId: 'cw-2' }
    expect(readiness([advisory], checked, [other], DAY)).toBe('caution')
    expect(applyWaivers([advisory], [{ ...other, unitId: 'cw-1' }], DAY)).toEqual([])
  })

  it('gives a director’s hold the last word, until a release of the same day', () => {
    const hold: DirectorAction = { kind: 'hold', day: DAY, reason: 'canopy crack' }
    const release: DirectorAction = { kind: 'release', day: DAY }
    expect(readiness([], checked, [hold], DAY)).toBe('held')
    expect(readiness([], checked, [hold, release], DAY)).toBe('ready')
    expect(readiness([], checked, [hold, release, hold], DAY)).toBe('held')
    expect(readiness([], checked, [hold], '2027-07-14')).toBe('unchecked')
  })

  it('does not let a release clear a blocking finding: that takes a waiver', () => {
    expect(readiness([blocking], checked, [{ kind: 'release', day: DAY }], DAY)).toBe('held')
  })
})
