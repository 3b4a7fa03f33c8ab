// Radio IDs: the unit's 24-bit address as six hex digits, unique in the competition, and for
// US registrations equal to the address the register assigns.
import { HARDWARE_CAUTION } from '../caution'
import { fieldIndex, othersLabel } from '../field'
import { nNumberToAddress } from '../nnumber'
import { normaliseRadioId } from '../normalise'
import type { Check, Finding } from '../types'
import { collisionWarningUnits } from './helpers'

const SIX_HEX = /^[0-9A-F]{6}$/

/** What is wrong with a radio ID, as the end of a sentence about it; null when it is well formed. */
export function radioIdProblem(radioId: string | null | undefined): 'missing' | 'format' | 'reserved' | null {
  const r = normaliseRadioId(radioId)
  if (!r) return 'missing'
  if (!SIX_HEX.test(r)) return 'format'
  if (r === '000000' || r === 'FFFFFF') return 'reserved'
  return null
}

export const radioIdFormat: Check = {
  id: 'radio-id.format',
  severity: 'blocking',
  source: 'ICAO Annex 10 Vol III ch. 9 (24-bit aircraft address)',
  rule: 'A radio ID is six hexadecimal digits, and not 000000 or FFFFFF.',
  run({ dossier }) {
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      const problem = radioIdProblem(u.radioId)
      if (!problem) continue
      out.push({
        checkId: this.id,
        severity: 'blocking',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: problem === 'missing'
          ? `The radio ID of the collision-warning unit ${u.model} is not entered.`
          : problem === 'format'
            ? `The radio ID “${u.radioId}” of the collision-warning unit ${u.model} is not six hexadecimal digits.`
            : `The radio ID ${normaliseRadioId(u.radioId)} of the collision-warning unit ${u.model} is reserved and never assigned to an aircraft.`,
        fixHint: 'Read the radio ID from the unit’s configuration (six hex digits, e.g. 3D2F1A) and enter it; if the unit itself is set wrongly, have it configured with the glider’s assigned address.',
      })
    }
    return out
  },
}

export const radioIdUnique: Check = {
  id: 'radio-id.unique',
  severity: 'blocking',
  source: 'common practice',
  rule: 'No two entries of the competition share a radio ID.',
  run({ dossier, field }) {
    const index = fieldIndex(field)
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      const r = normaliseRadioId(u.radioId)
      if (radioIdProblem(r)) continue
      const holders = index.byRadioId.get(r) ?? []
      const others = othersLabel(field, holders, dossier.entry.id)
      if (others.length === 0) continue
      out.push({
        checkId: this.id,
        severity: 'blocking',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: `The radio ID ${r} of the collision-warning unit ${u.model} is also declared by ${others.length === 1 ? 'entry' : 'entries'} ${others.join(', ')}. Two gliders with one address cannot warn each other.`,
        fixHint: 'Check the radio ID on the unit. If it is entered wrongly, correct it; if two units really share it, one must be reconfigured with its glider’s own address.',
      })
    }
    return out
  },
}

export const radioIdRegistration: Check = {
  id: 'radio-id.registration',
  severity: 'advisory',
  source: 'the published US N-number → ICAO address mapping (N1 = A00001 … N99999 = ADF7C7)',
  rule: 'For a US registration (N-number) the radio ID equals the address derived from the registration.',
  run({ dossier }) {
    const expected = nNumberToAddress(dossier.entry.registration)
    if (!expected) return []
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      const r = normaliseRadioId(u.radioId)
      if (radioIdProblem(r) || r === expected) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: `The registration ${dossier.entry.registration} has the assigned address ${expected}, but its collision-warning unit ${u.model} sends ${r}.`,
        fixHint: `If the unit should send the glider’s own address, have it configured to ${expected}; otherwise check the registration entered.`,
      })
    }
    return out
  },
}

export const RADIO_ID_CHECKS = [radioIdFormat, radioIdUnique, radioIdRegistration]
