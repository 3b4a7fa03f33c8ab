// The declaration in each recorder's latest IGC file against the entry: the identity fields
// block, the free-text ones advise; a stale file advises.
import { addDays } from '../dates'
import { classMatches, gliderTypesMatch, namesMatch, normaliseId } from '../normalise'
import type { Check, CheckContext, EngineIgcFile, Finding } from '../types'
import { flightRecorders } from './helpers'

/** Each declared recorder's latest IGC file (by flight date, then upload time). */
export function latestIgcFiles(ctx: CheckContext): Array<{ unitId: string, label: string, file: EngineIgcFile }> {
  const out: Array<{ unitId: string, label: string, file: EngineIgcFile }> = []
  for (const r of flightRecorders(ctx.dossier)) {
    let best: EngineIgcFile | undefined
    for (const f of ctx.dossier.igcFiles) {
      if (f.unitId !== r.id) continue
      if (!best || (f.flightDate ?? '') > (best.flightDate ?? '') || ((f.flightDate ?? '') === (best.flightDate ?? '') && f.uploadedAt > best.uploadedAt)) best = f
    }
    if (best) out.push({ unitId: r.id, label: `${r.model} (serial ${r.serial})`, file: best })
  }
  return out
}


export const declarationMatchesEntry: Check = {
  id: 'declaration.matches-entry',
  severity: 'blocking / advisory',
  source: 'IGC GNSS FR specification Appendix A, H records (HFPLT, HFCM2, HFGTY, HFGID, HFCID, HFCCL)',
  rule: 'In the latest IGC file from each recorder, glider ID = registration, competition ID = the entry’s and class = the entry’s class (blocking); pilot, co-pilot and glider type match allowing for case, spacing, punctuation, diacritics and word order (advisory).',
  run(ctx) {
    const { entry } = ctx.dossier
    const aliases = ctx.competition.classLimits[entry.classCode]?.aliases ?? []
    const out: Finding[] = []
    for (const { unitId, label, file } of latestIgcFiles(ctx)) {
      const subject = file.id ? `igc:${file.id}` : undefined
      const block = (what: string, declared: string | null, expected: string, fixHint: string) => out.push({
        checkId: this.id, severity: 'blocking', unitId, subject,
        reason: declared
          ? `The IGC file from ${label} declares ${what} “${declared}”, the entry says “${expected}”.`
          : `The IGC file from ${label} declares no ${what.replace(/^the /, '')}; the entry says “${expected}”.`,
        fixHint,
      })
      const advise = (what: string, declared: string | null | undefined, expected: string) => out.push({
        checkId: this.id, severity: 'advisory', unitId, subject,
        reason: declared
          ? `The IGC file from ${label} names the ${what} “${declared}”, the entry says “${expected}”.`
          : `The IGC file from ${label} names no ${what}; the entry says “${expected}”.`,
        fixHint: `Set the ${what} in the recorder’s declaration (or correct the entry), then upload a new IGC file.`,
      })
      const redeclare = 'Correct the declaration in the recorder (or the entry, if the entry is wrong), then upload a new IGC file from it.'
      if (normaliseId(file.gliderId) !== normaliseId(entry.registration)) block('the glider ID', file.gliderId, entry.registration, redeclare)
      if (normaliseId(file.competitionId) !== normaliseId(entry.compId)) block('the competition ID', file.competitionId, entry.compId, redeclare)
      if (!classMatches(file.competitionClass, entry.classCode, entry.className, aliases)) block('the class', file.competitionClass, entry.className, redeclare)
      if (!namesMatch(file.pilot, entry.pilotName)) advise('pilot', file.pilot, entry.pilotName)
      if (entry.copilotName && !namesMatch(file.copilot, entry.copilotName)) advise('co-pilot', file.copilot, entry.copilotName)
      if (!gliderTypesMatch(file.gliderType, entry.gliderType)) advise('glider type', file.gliderType, entry.gliderType)
    }
    return out
  },
}

export const declarationRecent: Check = {
  id: 'declaration.recent',
  severity: 'advisory',
  source: 'Gridmark rule',
  rule: 'The latest IGC file from each recorder is dated within the recency window (default 365 days) before the first contest day.',
  run(ctx) {
    const first = ctx.competition.firstContestDay
    const days = ctx.competition.rules.igcRecencyDays
    const oldest = addDays(first, -days)
    const out: Finding[] = []
    for (const { unitId, label, file } of latestIgcFiles(ctx)) {
      if (file.flightDate && file.flightDate >= oldest) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId,
        subject: file.id ? `igc:${file.id}` : undefined,
        reason: file.flightDate
          ? `The latest IGC file from ${label} is dated ${file.flightDate}, more than ${days} days before the first contest day (${first}).`
          : `The latest IGC file from ${label} carries no flight date.`,
        fixHint: 'Make a short flight (or a ground recording, where the competition allows) with the recorder set up for this entry, and upload its IGC file.',
      })
    }
    return out
  },
}

export const DECLARATION_CHECKS = [declarationMatchesEntry, declarationRecent]
