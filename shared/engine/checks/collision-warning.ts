// A collision-warning unit aboard, where the competition requires one.
import { HARDWARE_CAUTION } from '../caution'
import type { Check } from '../types'
import { collisionWarningUnits } from './helpers'

export const collisionWarningPresent: Check = {
  id: 'collision-warning.present',
  severity: 'blocking',
  source: 'competition rules (the setting “collision-warning unit required”, on by default); common practice',
  rule: 'The entry declares at least one collision-warning unit, where the competition requires one.',
  run({ dossier, competition }) {
    if (!competition.rules.collisionWarningRequired || collisionWarningUnits(dossier).length > 0) return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'collision-warning-units',
      caution: HARDWARE_CAUTION,
      reason: 'No collision-warning unit is declared; the competition requires one in every glider.',
      fixHint: 'Fit a collision-warning unit and declare it with its model, serial number, radio ID and firmware expiry date.',
    }]
  },
}
