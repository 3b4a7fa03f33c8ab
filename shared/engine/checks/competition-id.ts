// Competition IDs are painted on the glider and read from the ground: one per glider.
import { fieldIndex, othersLabel } from '../field'
import { normaliseId } from '../normalise'
import type { Check } from '../types'

export const competitionIdUnique: Check = {
  id: 'competition-id.unique',
  severity: 'blocking',
  source: 'common practice',
  rule: 'Competition IDs are unique within the competition.',
  run({ dossier, field }) {
    const key = normaliseId(dossier.entry.compId)
    const others = othersLabel(field, fieldIndex(field).byCompId.get(key) ?? [], dossier.entry.id)
    if (others.length === 0) return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'competition-id',
      reason: `The competition ID ${dossier.entry.compId} is also used by ${others.length === 1 ? 'another entry' : `${others.length} other entries`}.`,
      fixHint: 'Agree a different competition ID with the organiser and change the entry (and the marking on the glider).',
    }]
  },
}
