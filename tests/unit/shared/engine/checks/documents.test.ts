import { describe, expect, it } from 'vitest'
import { documentsRequired } from '#shared/engine/checks/documents'
import type { EngineDocument } from '#shared/engine/types'
import { competition, ctx, dossier } from '../builders'

const insuranceOnly = competition({ requiredDocumentKinds: ['insurance'] })
const withInsurance = (...docs: Array<Partial<EngineDocument>>) => dossier({ documents: docs.map(d => ({ kind: 'insurance', status: 'accepted', expiresOn: '2028-01-01', ...d })) })

describe('documents.required (FAI Sporting Code Section 3: valid certificate of airworthiness; local procedures)', () => {
  it('passes every required kind uploaded, accepted and valid through the contest', () => {
    expect(documentsRequired.run(ctx(dossier()))).toEqual([])
  })

  it('blocks a missing kind', () => {
    const [f] = documentsRequired.run(ctx(dossier({ documents: [] }), insuranceOnly))
    expect(f).toMatchObject({ severity: 'blocking', subject: 'document:insurance' })
    expect(f!.reason).toContain('No insurance document')
  })

  it('blocks a rejected and a pending document', () => {
    expect(documentsRequired.run(ctx(withInsurance({ status: 'rejected' }), insuranceOnly))[0]!.reason).toContain('rejected')
    expect(documentsRequired.run(ctx(withInsurance({ status: 'pending' }), insuranceOnly))[0]!.reason).toContain('waiting')
  })

  it('passes a document valid until the last contest day, blocks one valid until the day before', () => {
    expect(documentsRequired.run(ctx(withInsurance({ expiresOn: '2027-07-18' }), insuranceOnly))).toEqual([])
    const [f] = documentsRequired.run(ctx(withInsurance({ expiresOn: '2027-07-17' }), insuranceOnly))
    expect(f!.reason).toContain('valid until 2027-07-17, the last contest day is 2027-07-18')
  })

  it('lets an accepted document count even beside a rejected earlier one', () => {
    expect(documentsRequired.run(ctx(withInsurance({ status: 'rejected' }, { status: 'accepted' }), insuranceOnly))).toEqual([])
  })

  it('asks only for the kinds the competition requires', () => {
    expect(documentsRequired.run(ctx(dossier({ documents: [] }), competition({ requiredDocumentKinds: [] })))).toEqual([])
  })
})
