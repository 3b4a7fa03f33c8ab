// Flight recorders: enough of them, at an approval level the competition accepts.
import { APPROVAL_LEVEL_LABELS, type ApprovalLevel } from '../../constants/entries'
import { HARDWARE_CAUTION } from '../caution'
import type { Check } from '../types'
import { flightRecorders, plural } from './helpers'

export const recorderPresent: Check = {
  id: 'recorder.present',
  severity: 'blocking',
  source: 'IGC GNSS FR specification 1.1.4 (approval levels), 1.1.5.3',
  rule: 'At least one flight recorder (two where the competition requires) with an accepted approval level.',
  run({ dossier, competition }) {
    const required = competition.rules.recordersRequired
    const accepted = competition.rules.acceptedApprovalLevels as readonly string[]
    const recorders = flightRecorders(dossier)
    const good = recorders.filter(r => r.approvalLevel && accepted.includes(r.approvalLevel))
    if (good.length >= required) return []
    const acceptedText = accepted.map(l => `“${APPROVAL_LEVEL_LABELS[l as ApprovalLevel]?.toLowerCase() ?? l}”`).join(' or ')
    const notAccepted = recorders.filter(r => !good.includes(r))
    let reason: string
    if (recorders.length === 0) {
      reason = `No flight recorder is declared; the competition requires ${plural(required, 'recorder', 'recorders')}.`
    }
    else {
      const detail = notAccepted.map(r => `The ${r.model} (serial ${r.serial}) is ${r.approvalLevel ? `approved for “${APPROVAL_LEVEL_LABELS[r.approvalLevel as ApprovalLevel]?.toLowerCase() ?? r.approvalLevel}”` : 'of unknown approval level'}`).join('; ')
      const declared = good.length === 0 ? 'No flight recorder' : plural(good.length, 'flight recorder', 'flight recorders')
      reason = `${declared} with an accepted approval level (${acceptedText}) ${good.length === 1 ? 'is' : 'are'} declared; the competition requires ${required}${detail ? `. ${detail}` : ''}.`
    }
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'flight-recorders',
      caution: HARDWARE_CAUTION,
      reason,
      fixHint: `Fit and declare ${required === 1 ? 'a flight recorder' : 'flight recorders'} approved for ${acceptedText}, with serial number and approval level.`,
    }]
  },
}
