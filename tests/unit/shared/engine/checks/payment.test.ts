import { describe, expect, it } from 'vitest'
import { entryPaid } from '#shared/engine/checks/payment'
import { ctx, dossier } from '../builders'

describe('entry.paid (organiser setting)', () => {
  it('passes a paid entry', () => {
    expect(entryPaid.run(ctx(dossier()))).toEqual([])
  })

  it('blocks an unpaid entry, naming the first contest day', () => {
    const [f] = entryPaid.run(ctx(dossier({ payment: { status: 'unpaid' } })))
    expect(f).toMatchObject({ severity: 'blocking', subject: 'payment' })
    expect(f!.reason).toContain('2027-07-12')
    expect(f!.caution).toBeUndefined()
  })

  it('blocks a refunded entry', () => {
    expect(entryPaid.run(ctx(dossier({ payment: { status: 'refunded' } })))[0]!.reason).toContain('refunded')
  })
})

describe('entry.paid: what is owed (organiser setting; the fee set by the organiser)', () => {
  it('names the amount still to pay after a part payment or a change to a dearer class', () => {
    const [f] = entryPaid.run(ctx(dossier({ payment: { status: 'unpaid', owedMinor: 4550, currency: 'EUR' } })))
    expect(f!.reason).toBe('€45.50 of the entry fee is still to pay; it is due before the first contest day (2027-07-12).')
    expect(f!.fixHint).toContain('Pay the €45.50 from your entry page')
    expect(f!.fixHint).toContain('ask the competition office if you have paid another way')
  })

  it('says a refunded fee is owed again, with the amount', () => {
    const [f] = entryPaid.run(ctx(dossier({ payment: { status: 'refunded', owedMinor: 30000, currency: 'EUR' } })))
    expect(f!.reason).toBe('The entry fee was refunded, so €300.00 is owed again; it is due before the first contest day (2027-07-12).')
  })

  it('keeps the plain words when nothing is known of the amount', () => {
    const [f] = entryPaid.run(ctx(dossier({ payment: { status: 'unpaid', owedMinor: 0, currency: 'EUR' } })))
    expect(f!.reason).toBe('The entry fee is not paid yet; it is due before the first contest day (2027-07-12).')
  })
})
