// The words of an entry's timeline, from what audit() stores.
import { describe, expect, it } from 'vitest'
import { timelineSummary } from '#domain/audit/audit-log'

describe('timelineSummary', () => {
  it('says what a grid check found', () => {
    expect(timelineSummary('grid-check', { outcome: 'pass', readiness: 'ready', blocking: [] })).toBe('Grid check: passed; ready')
    expect(timelineSummary('grid-check', { outcome: 'fail', readiness: 'held', blocking: ['entry.paid'], massKg: 402.5 }))
      .toBe('Grid check: failed, weighed 402.5 kg; held — blocking: entry.paid')
  })

  it('says which findings came and went, and how readiness moved', () => {
    expect(timelineSummary('findings', {
      added: [{ checkId: 'entry.paid', severity: 'blocking' }],
      removed: [{ checkId: 'firmware.expires-soon', severity: 'advisory' }],
      readiness: { from: 'caution', to: 'held' },
    })).toBe('Findings changed: new: entry.paid (blocking); cleared: firmware.expires-soon (advisory) — Caution → Held')
  })

  it('gives the director’s reasons and a waiver’s scope', () => {
    expect(timelineSummary('hold', { reason: 'Canopy lock' })).toBe('Held by the director: Canopy lock')
    expect(timelineSummary('release', { reason: 'Fixed' })).toBe('Released by the director: Fixed')
    expect(timelineSummary('waiver', { checkId: 'entry.paid', scope: 'day', day: '2027-07-13', reason: 'Paid in cash' }))
      .toBe('Waived entry.paid for 2027-07-13: Paid in cash')
    expect(timelineSummary('waiver', { checkId: 'entry.paid', scope: 'competition', day: null, reason: 'Paid in cash' }))
      .toBe('Waived entry.paid for the whole competition: Paid in cash')
  })

  it('says a waiver was withdrawn, and why', () => {
    expect(timelineSummary('waiver', { withdrawn: true, checkId: 'entry.paid', scope: 'day', day: '2027-07-13', reason: 'No cash was received' }))
      .toBe('Waiver of entry.paid withdrawn: No cash was received')
  })
})

describe('timelineSummary of a deleted document file', () => {
  it('tells the pilot which file went, how long it was kept, and what stays', () => {
    expect(timelineSummary('document', { entryId: 'e1', kind: 'licence', reason: 'retention-medical', keptDays: 10 }))
      .toBe('Pilot licence file deleted, kept 10 days after the competition; its kind, validity and review outcome stay on record')
  })
})
