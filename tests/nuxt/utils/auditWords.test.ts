import { describe, expect, it } from 'vitest'
import { auditActionWords, auditDescription } from '~/utils/auditWords'

describe('audit words', () => {
  it('names known actions in words and shows an unknown one as stored', () => {
    expect(auditActionWords('grid-check.recorded')).toBe('Grid check recorded')
    expect(auditActionWords('director.hold')).toBe('Held')
    expect(auditActionWords('director.release')).toBe('Released')
    expect(auditActionWords('director.waiver')).toBe('Finding waived')
    expect(auditActionWords('director.waiver-withdrawn')).toBe('Waiver withdrawn')
    expect(auditActionWords('day.reopened')).toBe('Day opened again')
    expect(auditActionWords('weather.changed')).toBe('weather.changed')
  })

  it('describes a row from its details', () => {
    expect(auditDescription({ action: 'director.hold', details: { day: '2026-12-02', reason: 'Canopy crack' } })).toBe('2026-12-02: Canopy crack')
    expect(auditDescription({ action: 'director.waiver', details: { day: null, scope: 'competition', checkId: 'entry.paid', reason: 'Paid in cash' } }))
      .toBe('entry.paid for the whole competition: Paid in cash')
    expect(auditDescription({ action: 'grid-check.recorded', details: { day: '2026-12-02', outcome: 'fail', readiness: 'held', massKg: 402.5, blocking: ['entry.paid'] } }))
      .toBe('2026-12-02: Failed, Held, weighed 402.5 kg, blocking: entry.paid')
    expect(auditDescription({ action: 'findings.changed', details: { day: '2026-12-02', added: [{ checkId: 'entry.paid', severity: 'blocking' }], removed: [], readiness: { from: 'unchecked', to: 'held' } } }))
      .toBe('2026-12-02: new entry.paid (blocking); Unchecked → Held')
    expect(auditDescription({ action: 'day.opened', details: { day: '2026-12-02', kind: 'practice', entries: 2 } })).toBe('2026-12-02 (practice day), 2 on the board')
    expect(auditDescription({ action: 'day.closed', details: { day: '2026-12-02', readiness: { ready: 3, held: 1 } } })).toBe('2026-12-02: 3 ready, 1 held')
    expect(auditDescription({ action: 'entry.updated', details: { field: 'registration', from: 'G-AAAA', to: 'G-BBBB' } })).toBe('Registration: G-AAAA → G-BBBB')
    expect(auditDescription({ action: 'unit.added', details: { kind: 'flight-recorder', model: 'Example Logger 3', serial: 'FR-0001' } })).toBe('Example Logger 3, serial FR-0001')
    expect(auditDescription({ action: 'entry.created', details: { compId: 'DX', registration: 'G-98AA', classId: 'c' } })).toBe('DX · G-98AA')
    expect(auditDescription({ action: 'tag.issued', details: { tagId: 't', shortCode: 'HY369FYA' } })).toBe('short code HY36-9FYA')
    expect(auditDescription({ action: 'entry.rejected', details: { from: 'submitted', to: 'rejected', reason: 'No insurance' } })).toBe('submitted → rejected · reason: No insurance')
    expect(auditDescription({ action: 'entry.withdrawn', details: { from: 'accepted', to: 'withdrawn', by: 'office', reason: 'Injured', paidMinor: 0 } })).toBe('accepted → withdrawn by the office for the pilot · reason: Injured')
    expect(auditDescription({ action: 'entry.withdrawn', details: { from: 'draft', to: 'withdrawn', by: 'entrant', paidMinor: 0 } })).toBe('draft → withdrawn by the entrant')
    expect(auditDescription({ action: 'entry.withdrawn', details: { from: 'draft', to: 'withdrawn' } })).toBe('draft → withdrawn')
  })

  it('says a personal field changed without its values, and names fields in words', () => {
    expect(auditDescription({ action: 'entry.updated', details: { field: 'pilotPhone', changed: true } })).toBe('Phone changed')
    expect(auditDescription({ action: 'entry.updated', details: { field: 'emergencyContact', changed: true } })).toBe('Emergency contact changed')
    expect(auditDescription({ action: 'entry.updated', details: { field: 'spanM', from: 15, to: 18 } })).toBe('Span (m): 15 → 18')
    expect(auditDescription({ action: 'entry.updated', details: { field: 'somethingNew', changed: true } })).toBe('somethingNew changed')
    expect(auditDescription({ action: 'entry.withdrawn', details: { from: 'accepted', to: 'withdrawn', by: 'entrant', reasonGiven: true } }))
      .toBe('accepted → withdrawn by the entrant · with a reason, sent to the office')
  })

  it('describes payments by amount, method, day and reason, and a change of paid state with what is owed', () => {
    expect(auditActionWords('payment.recorded')).toBe('Payment recorded')
    expect(auditActionWords('payment.waived')).toBe('Entry fee waived')
    expect(auditDescription({ action: 'payment.recorded', details: { method: 'bank-transfer', amountMinor: 30000, currency: 'EUR', paidOn: '2027-03-03' } }))
      .toBe('€300.00, bank transfer: 2027-03-03')
    expect(auditDescription({ action: 'payment.waived', details: { method: 'waived', amountMinor: 5000, currency: 'EUR', paidOn: '2027-03-03', reason: 'Club guest' } }))
      .toBe('€50.00, fee waived: 2027-03-03: Club guest')
    expect(auditDescription({ action: 'payment.refunded', details: { method: 'card', refundedMinor: 2500, currency: 'GBP', reason: 'Paid twice' } }))
      .toBe('£25.00, card: Paid twice')
    expect(auditDescription({ action: 'payment.status-changed', details: { from: 'paid', to: 'unpaid', owedMinor: 15000, currency: 'EUR' } }))
      .toBe('paid → unpaid (€150.00 owed)')
  })

  it('describes a document file deleted on the retention schedule by kind and how long it was kept', () => {
    expect(auditActionWords('document.file-deleted')).toBe('Document file deleted (retention)')
    expect(auditDescription({ action: 'document.file-deleted', details: { entryId: 'e', kind: 'medical', reason: 'retention-medical', keptDays: 30 } }))
      .toBe('Medical, kept 30 days after the competition')
    expect(auditDescription({ action: 'document.file-deleted', details: { entryId: 'e', kind: 'insurance', reason: 'retention-superseded', keptDays: 30 } }))
      .toBe('Insurance, kept 30 days after a newer copy was accepted')
  })
})
