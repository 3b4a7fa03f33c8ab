// The rows of the CSV exports of the scrutineering record, from what the grid checks store.
// Cells that a spreadsheet would run as formulas are defused (OWASP, "CSV Injection").
import { describe, expect, it } from 'vitest'
import { gridLogRecords, readinessRecords, READINESS_CSV_HEADER } from '#domain/board/exports'
import { DEFAULT_CHECKLIST } from '#shared/constants/grid'
import type { BoardTile } from '#shared/types/api-board'

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
