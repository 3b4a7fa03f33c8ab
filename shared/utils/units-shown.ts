// "The unit shows another version" on the grid: the dossier as the unit's own display has it.
// The phone runs the checks on it at once; the server runs them on it when the grid check
// arrives, after correcting the unit in the same transaction.
import type { Dossier } from '../engine/types'

export interface UnitShownValues {
  unitId: string
  firmwareVersion: string
  firmwareExpiresOn: string
}

/** The dossier with each shown collision-warning unit's firmware version and expiry date; other units unchanged. */
export function withUnitsShown(dossier: Dossier, shown: readonly UnitShownValues[] | undefined): Dossier {
  if (!shown?.length) return dossier
  const byId = new Map(shown.map(s => [s.unitId, s]))
  return {
    ...dossier,
    units: dossier.units.map((u) => {
      const s = byId.get(u.id)
      if (!s || u.kind !== 'collision-warning') return u
      return { ...u, firmwareVersion: s.firmwareVersion, firmwareExpiresOn: s.firmwareExpiresOn }
    }),
  }
}
