// Collision-warning firmware: valid through the contest, not about to expire, updated yearly,
// and agreeing with the organiser's firmware catalogue.
import { HARDWARE_CAUTION } from '../caution'
import { addDays, addYears, daysBetween } from '../dates'
import type { Check, Finding, FirmwareRelease } from '../types'
import { collisionWarningUnits, plural, unitLabel } from './helpers'

export const firmwareValidThroughContest: Check = {
  id: 'firmware.valid-through-contest',
  severity: 'blocking',
  source: 'common practice: expired firmware stops the unit transmitting and receiving',
  rule: 'A collision-warning unit’s firmware expiry date is after the last contest day plus the competition’s margin. The expiry date is the first day the unit no longer works.',
  run({ dossier, competition }) {
    const last = competition.lastContestDay
    const margin = competition.rules.firmwareMarginDays
    const mustPass = addDays(last, margin)
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      const base = { checkId: this.id, severity: 'blocking' as const, unitId: u.id, caution: HARDWARE_CAUTION }
      if (!u.firmwareExpiresOn) {
        out.push({ ...base, reason: `The firmware expiry date of the ${unitLabel(u)} is not entered, so it cannot be shown to work through the last contest day (${last}).`, fixHint: 'Enter the firmware expiry date the unit shows (or its release notes give).' })
        continue
      }
      if (u.firmwareExpiresOn > mustPass) continue
      const marginText = margin > 0 ? `; the competition asks for ${plural(margin, 'day', 'days')} beyond it (through ${mustPass})` : ''
      out.push({
        ...base,
        reason: `The firmware of the ${unitLabel(u)} expires ${u.firmwareExpiresOn}, the last contest day is ${last}${marginText}. From its expiry date the unit stops transmitting and receiving.`,
        fixHint: `Update the unit to a firmware release that expires after ${mustPass}, then enter the new version and expiry date.`,
      })
    }
    return out
  },
}

export const firmwareExpiresSoon: Check = {
  id: 'firmware.expires-soon',
  severity: 'advisory',
  source: 'common practice',
  rule: 'Advise when a collision-warning unit’s firmware expires within the warning window (default 30 days) after the last contest day.',
  run({ dossier, competition }) {
    const last = competition.lastContestDay
    const blockedThrough = addDays(last, competition.rules.firmwareMarginDays)
    const warnThrough = addDays(last, competition.rules.firmwareWarningDays)
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      const exp = u.firmwareExpiresOn
      if (!exp || exp <= blockedThrough || exp > warnThrough) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: `The firmware of the ${unitLabel(u)} expires ${exp}, ${plural(daysBetween(last, exp), 'day', 'days')} after the last contest day (${last}).`,
        fixHint: 'Plan the firmware update soon after the contest, or update before it to be safe.',
      })
    }
    return out
  },
}

export const firmwareYearlyUpdate: Check = {
  id: 'firmware.yearly-update',
  severity: 'advisory',
  source: 'common practice: update yearly, at the annual inspection',
  rule: 'Advise when a collision-warning unit’s firmware was last updated more than 12 months before the first contest day.',
  run({ dossier, competition }) {
    const first = competition.firstContestDay
    const yearBefore = addYears(first, -1)
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      if (!u.firmwareUpdatedOn || u.firmwareUpdatedOn >= yearBefore) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId: u.id,
        caution: HARDWARE_CAUTION,
        reason: `The firmware of the ${unitLabel(u)} was last updated ${u.firmwareUpdatedOn}, more than a year before the first contest day (${first}).`,
        fixHint: 'Update the firmware (yearly, at the annual inspection, is common practice) and enter the date of the update.',
      })
    }
    return out
  },
}

function sameText(a: string, b: string): boolean {
  return a.trim().toLowerCase() === b.trim().toLowerCase()
}

/** The organiser's catalogue release for a unit family (its model) and firmware version, if listed. */
export function catalogueRelease(catalogue: readonly FirmwareRelease[] | undefined, model: string, version: string): FirmwareRelease | undefined {
  return catalogue?.find(r => sameText(r.family, model) && sameText(r.version, version))
}

export const firmwareCatalogueMismatch: Check = {
  id: 'firmware.catalogue-mismatch',
  severity: 'advisory',
  source: 'Gridmark rule',
  rule: 'Advise when the entered firmware expiry date differs from the organiser’s firmware catalogue for that unit family and version.',
  run({ dossier, competition }) {
    const catalogue = competition.firmwareCatalogue ?? []
    if (catalogue.length === 0) return []
    const out: Finding[] = []
    for (const u of collisionWarningUnits(dossier)) {
      if (!u.firmwareVersion) continue
      const release = catalogueRelease(catalogue, u.model, u.firmwareVersion)
      if (!release || release.expiresOn === u.firmwareExpiresOn) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId: u.id,
        reason: `For ${u.model} firmware ${u.firmwareVersion} the entry says it expires ${u.firmwareExpiresOn ?? '(not entered)'}; the organiser’s catalogue says ${release.expiresOn}.`,
        fixHint: 'Check the version and expiry date on the unit itself and correct the entry, or tell the organiser if the catalogue is wrong.',
      })
    }
    return out
  },
}

export const FIRMWARE_CHECKS = [firmwareValidThroughContest, firmwareExpiresSoon, firmwareYearlyUpdate, firmwareCatalogueMismatch]
