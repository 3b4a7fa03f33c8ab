import { describe, expect, it } from 'vitest'
import { igcSecurityRecord } from '#shared/engine/checks/igc'
import type { EngineIgcFile } from '#shared/engine/types'
import { ctx, dossier } from '../builders'

const file = (hasGRecord: boolean): EngineIgcFile => ({
  unitId: 'fr-1', flightDate: '2027-05-20', pilot: 'Linnea Holmquist', gliderType: 'Tarn 15', gliderId: 'KM-ABC',
  competitionId: 'A1', competitionClass: 'Standard', hasGRecord, uploadedAt: '2027-05-21T08:00:00Z',
})

describe('igc.security-record (IGC GNSS FR specification Appendix A, 2008 edition: A2.5.7 mandatory records, A3.2 the G record)', () => {
  it('advises on a file without a G record', () => {
    const [f] = igcSecurityRecord.run(ctx(dossier({ igcFiles: [file(false)] })))
    expect(f).toMatchObject({ checkId: 'igc.security-record', severity: 'advisory', unitId: 'fr-1' })
  })

  it('passes a file with one', () => {
    expect(igcSecurityRecord.run(ctx(dossier({ igcFiles: [file(true)] })))).toEqual([])
  })
})
