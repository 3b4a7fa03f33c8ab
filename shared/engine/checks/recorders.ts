// Flight recorders: enough of them, at an approval level the competition accepts.
import { APPROVAL_LEVEL_LABELS, type ApprovalLevel } from '../../constants/entries'
import { HARDWARE_CAUTION } from '../caution'
import type { Check, Finding, FlightRecorderUnit } from '../types'
import { formatRecorderId } from '../../utils/recorder-id'
import { latestIgcFiles, unattachedLabel } from './declaration'
import { flightRecorders, plural } from './helpers'

export const recorderPresent: Check = {
  id: 'recorder.present',
  severity: 'blocking',
  source: 'FAI Sporting Code Section 3 Annex B 4.1.1 (the three IGC approval levels of flight recorders); competition rules (how many recorders)',
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

export const recorderIgcFile: Check = {
  id: 'recorder.igc-file',
  severity: 'blocking / advisory',
  source: 'IGC GNSS FR specification (the declaration is made before flight and written to the IGC file’s H records); common practice',
  rule: 'Every declared flight recorder has a current IGC file (blocking); a file uploaded without naming its recorder is checked against the entry too, and the entrant is asked to say which recorder it came from (advisory).',
  run({ dossier }) {
    const out: Finding[] = []
    const loose = dossier.igcFiles.filter(f => f.unitId == null)
    const looseNote = loose.length
      ? ` ${loose.length === 1 ? `The file ${unattachedLabel(loose[0]!)} is` : `${loose.length} files are`} on the entry without a recorder named: if it came from this recorder, say so on the entry page.`
      : ''
    for (const r of flightRecorders(dossier)) {
      if (dossier.igcFiles.some(f => f.unitId === r.id)) continue
      out.push({
        checkId: this.id,
        severity: 'blocking',
        unitId: r.id,
        caution: HARDWARE_CAUTION,
        reason: `No IGC file from the ${r.model} (serial ${r.serial}) is uploaded, so its declaration cannot be checked.${looseNote}`,
        fixHint: 'Declare the pilot, glider and competition ID in this recorder, record a short flight or ground recording, download it with the recorder’s own download method and upload the IGC file, naming this recorder.',
      })
    }
    for (const f of loose) {
      out.push({
        checkId: this.id,
        severity: 'advisory',
        subject: f.id ? `igc:${f.id}` : 'igc',
        reason: `The IGC file ${unattachedLabel(f)} does not say which flight recorder it came from.`,
        fixHint: 'On the entry page, choose the flight recorder this file came from.',
      })
    }
    return out
  },
}

/** A recorder identity compared without case, spaces or dashes ("xxx-abc" = "XXXABC"). */
function compactId(s: string | null | undefined): string {
  return (s ?? '').toUpperCase().replace(/[^A-Z0-9]/g, '')
}

/** A firmware version compared without case, spaces or a leading "v"/"version". */
export function firmwareKey(s: string | null | undefined): string {
  return (s ?? '').toLowerCase().replace(/^\s*(version|ver\.?|v)\s*/, '').replace(/[\s_]/g, '')
}

/** The declared IGC recorder ID matches the A record's six characters (or its serial id alone). */
export function recorderIdMatches(declared: string | null | undefined, aRecord: string | null | undefined): boolean {
  const d = compactId(declared)
  const a = compactId(aRecord)
  if (!d || !a) return true
  return d.length === 3 ? a.slice(3) === d : a === d
}

function recorderOf(units: readonly FlightRecorderUnit[], id: string | undefined): FlightRecorderUnit | undefined {
  return id ? units.find(u => u.id === id) : undefined
}

export const recorderIdentity: Check = {
  id: 'recorder.identity',
  severity: 'advisory',
  source: 'IGC GNSS FR specification Appendix A: A3.1 (A record: three-character manufacturer code and three-character serial id), A3.3.1 (HFRFW, the firmware version); paragraph numbers of the 2008 edition',
  rule: 'The recorder identity in the A record of each recorder’s latest IGC file (manufacturer code + serial id) and the firmware version in its H record match what is declared for that recorder.',
  run(ctx) {
    const recorders = flightRecorders(ctx.dossier)
    const out: Finding[] = []
    for (const { unitId, file, title } of latestIgcFiles(ctx)) {
      const r = recorderOf(recorders, unitId)
      if (!r) continue
      const subject = file.id ? `igc:${file.id}` : undefined
      const fileId = compactId(file.recorderId)
      const shown = formatRecorderId(fileId)
      if (fileId && !compactId(r.igcRecorderId)) {
        out.push({
          checkId: this.id, severity: 'advisory', unitId, subject,
          reason: `${title} comes from recorder ${shown}; no IGC recorder ID is entered for the ${r.model} (serial ${r.serial}).`,
          fixHint: `Enter the recorder’s IGC recorder ID (${shown}, as its IGC files’ first line gives it) on the entry page, so every file can be tied to it.`,
        })
      }
      else if (!recorderIdMatches(r.igcRecorderId, file.recorderId)) {
        out.push({
          checkId: this.id, severity: 'advisory', unitId, subject, caution: HARDWARE_CAUTION,
          reason: `${title} comes from recorder ${shown}, but the ${r.model} is declared with IGC recorder ID ${formatRecorderId(r.igcRecorderId)}: the file may be from another recorder.`,
          fixHint: 'Upload a file downloaded from this recorder, or correct the IGC recorder ID declared for it.',
        })
      }
      if (file.firmwareVersion && r.firmwareVersion && firmwareKey(file.firmwareVersion) !== firmwareKey(r.firmwareVersion)) {
        out.push({
          checkId: this.id, severity: 'advisory', unitId, subject,
          reason: `${title} was written by firmware ${file.firmwareVersion}; the ${r.model} is declared with firmware ${r.firmwareVersion}.`,
          fixHint: 'Correct the declared firmware version, or upload a file recorded with the firmware the recorder now runs.',
        })
      }
    }
    return out
  },
}
