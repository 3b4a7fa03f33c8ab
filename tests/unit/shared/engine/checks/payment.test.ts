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
