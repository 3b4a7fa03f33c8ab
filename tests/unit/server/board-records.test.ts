// The words of an entry's timeline and the rows of the CSV exports, from what audit() and the
// grid checks store. Cells that a spreadsheet would run as formulas are defused (OWASP, "CSV
// Injection").
import { describe, expect, it } from 'vitest'
import { timelineSummary } from '../../../server/utils/audit-log'
import { gridLogRecords, readinessRecords, READINESS_CSV_HEADER } from '../../../server/utils/board-exports'
import { competitionOfWrite } from '../../../server/utils/board-refresh'
import { DEFAULT_CHECKLIST } from '#shared/constants/grid'
import type { BoardTile } from '#shared/types/api-board'

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
})

describe('gridLogRecords', () => {
  const row = {
    day: '2027-07-13',
    checked_at: new Date('2027-07-13T08:00:00Z'),
    received_at: new Date('2027-07-13T08:00:02Z'),
    comp_id: 'K7',
    class_name: 'Standard',
    pilot_name: '=HYPERLINK("x")',
    registration: 'KM-ADH',
    scrutineer_name: 'Aoife Brennick',
    found_by: 'scan',
    outcome: 'fail',
    readiness: 'held' as const,
    answers: [
      { itemId: 'antennas', label: 'Antennas fitted', result: 'fail' as const, note: 'Loose cable' },
      { itemId: 'old-item', label: 'An item since removed', result: 'pass' as const, note: '' },
    ],
    findings: [{ checkId: 'entry.paid', severity: 'blocking' }, { checkId: 'firmware.expires-soon', severity: 'advisory' }],
    notes: 'Back to the trailer',
    mass_kg: '402.50',
    cg_arm_m: '0.3120',
  }

  it('has a column per checklist item, keeps answers to removed items, and defuses formulas', () => {
    const [header, record] = gridLogRecords(DEFAULT_CHECKLIST, [row])
    expect(header).toContain('Antennas fitted')
    expect(header!.length).toBe(record!.length)
    const cell = (name: string) => record![header!.indexOf(name)]
    expect(cell('Antennas fitted')).toBe('fail — Loose cable')
    expect(cell('Tag readable')).toBe('')
    expect(cell('Other answers')).toBe('An item since removed: pass')
    expect(cell('Pilot')).toBe('\'=HYPERLINK("x")')
    expect(cell('Readiness')).toBe('Held')
    expect(cell('Blocking findings')).toBe('entry.paid')
    expect(cell('Mass (kg)')).toBe('402.50')
  })
})

describe('readinessRecords', () => {
  it('writes one row per tile with its words', () => {
    const tile: BoardTile = {
      entryId: 'e', compId: 'S2', classId: 'c', className: 'Club', pilotName: 'Dmitri Alvane', registration: 'KM-CPG', gliderType: 'Scree 102',
      readiness: 'held', headline: { kind: 'hold', text: 'Canopy lock' }, counts: { blocking: 0, advisory: 1, waived: 0 },
      lastCheck: null, hold: { reason: 'Canopy lock', by: 'Marguerite Sallow', at: '2027-07-13T08:00:00.000Z' }, seq: 3, updatedAt: '2027-07-13T08:00:00.000Z',
    }
    const [header, record] = readinessRecords('2027-07-13', [tile])
    expect(header).toEqual(READINESS_CSV_HEADER)
    expect(record).toEqual(['2027-07-13', 'S2', 'Club', 'Dmitri Alvane', 'KM-CPG', 'Scree 102', 'Held', 'Canopy lock', '0', '1', '0', '', '', '', 'Marguerite Sallow', 'Canopy lock'])
  })
})

describe('competitionOfWrite', () => {
  const id = '0b6a3c1e-7d7f-4d8e-9a51-2f1f0c3b9d44'
  it('names the competition of a successful write under its address', () => {
    expect(competitionOfWrite('PATCH', `/api/competitions/${id}/entries/x`, 200)).toBe(id)
    expect(competitionOfWrite('POST', `/api/competitions/${id.toUpperCase()}/entries`, 201)).toBe(id)
  })
  it('ignores reads, refusals and other addresses', () => {
    expect(competitionOfWrite('GET', `/api/competitions/${id}/entries`, 200)).toBeNull()
    expect(competitionOfWrite('POST', `/api/competitions/${id}/entries`, 409)).toBeNull()
    expect(competitionOfWrite('POST', '/api/auth/login', 200)).toBeNull()
    expect(competitionOfWrite('POST', `/api/competitions/${id}`, 200)).toBeNull()
  })
})
