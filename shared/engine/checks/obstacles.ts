// The obstacle database of a collision-warning unit, where one is given.
import { HARDWARE_CAUTION } from '../caution'
import type { Check, Finding } from '../types'
import { collisionWarningUnits, unitLabel } from './helpers'

export const obstaclesCurrent: Check = {
  id: 'obstacles.current',
  severity: 'advisory',
  source: 'Gridmark rule',
  rule: 'A collision-warning unit’s obstacle database, where given, is valid through the last contest day (its expiry date is the first day it is no longer valid).',
  run({ dossier, competition }) {
    const last = competition.lastContestDay
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      if (!u.obstacleDbExpiresOn || u.obstacleDbExpiresOn > last) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: `The obstacle database of the ${unitLabel(u)} expires ${u.obstacleDbExpiresOn}, the last contest day is ${last}.`,
        fixHint: `Load an obstacle database valid after ${last} and enter its expiry date.`,
      })
    }
    return out
  },
}
