// The dossier as a unit's display shows it (common practice: the scrutineer compares the
// version the collision-warning unit shows with the dossier).
import { describe, expect, it } from 'vitest'
import type { Dossier } from '#shared/engine'
import { withUnitsShown } from '#shared/utils/units-shown'

const dossier = {
  entry: { id: 'e1' },
  units: [
    { id: 'u1', kind: 'collision-warning', model: 'CW-200', radioId: 'ABC123', firmwareVersion: '7.08', firmwareExpiresOn: '2027-03-01' },
    { id: 'u2', kind: 'flight-recorder', model: 'LX-R', serial: 'R1', approvalLevel: 'all-flights', firmwareVersion: '2.1' },
  ],
  documents: [], igcFiles: [], payment: { status: 'paid' }, weighIns: [],
} as unknown as Dossier

describe('withUnitsShown', () => {
  it('replaces the shown unit’s firmware version and expiry, and nothing else', () => {
    const out = withUnitsShown(dossier, [{ unitId: 'u1', firmwareVersion: '7.20', firmwareExpiresOn: '2028-03-01' }])
    expect(out.units[0]).toEqual({ ...dossier.units[0], firmwareVersion: '7.20', firmwareExpiresOn: '2028-03-01' })
    expect(out.units[1]).toBe(dossier.units[1])
    // The dossier it was given is left as it was.
    expect(dossier.units[0]).toMatchObject({ firmwareVersion: '7.08' })
  })

  it('leaves a flight recorder and unknown units alone, and returns the same dossier without readings', () => {
    const out = withUnitsShown(dossier, [{ unitId: 'u2', firmwareVersion: '9', firmwareExpiresOn: '2030-01-01' }, { unitId: 'nope', firmwareVersion: '1', firmwareExpiresOn: '2030-01-01' }])
    expect(out.units).toEqual(dossier.units)
    expect(withUnitsShown(dossier, undefined)).toBe(dossier)
    expect(withUnitsShown(dossier, [])).toBe(dossier)
  })
})
