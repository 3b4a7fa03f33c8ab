// The declaration in each recorder's latest IGC file against the entry: the identity fields
// block, the free-text ones advise; a stale file advises.
import { HARDWARE_CAUTION } from '../caution'
import { addDays } from '../dates'
import { classMatches, gliderTypesMatch, namesMatch, normaliseId } from '../normalise'
import type { Check, CheckContext, EngineIgcFile, Finding } from '../types'
import { flightRecorders } from './helpers'

/** An IGC file's place in time: by flight date, then upload time. */
function later(a: EngineIgcFile, b: EngineIgcFile): boolean {
  return (a.flightDate ?? '') > (b.flightDate ?? '') || ((a.flightDate ?? '') === (b.flightDate ?? '') && a.uploadedAt > b.uploadedAt)
}

/** How a reason names a file no recorder was named for. */
export function unattachedLabel(file: EngineIgcFile): string {
  return file.filename ? `“${file.filename}” (no recorder named)` : '(no recorder named)'
}

/** One file the declaration checks read, and how a reason names it ("The IGC file from …"). */
export interface CheckedIgcFile {
  unitId: string | undefined
  label: string
  file: EngineIgcFile
  /** "The IGC file from Plover FR-2 (serial FR7300)" or "The IGC file “x.igc” (no recorder named)". */
  title: string
}

/**
 * Each declared recorder's latest IGC file (by flight date, then upload time), then the latest
 * file uploaded without a recorder (unitId null), which is checked against the entry too.
 */
export function latestIgcFiles(ctx: CheckContext): CheckedIgcFile[] {
  const out: CheckedIgcFile[] = []
  for (const r of flightRecorders(ctx.dossier)) {
    let best: EngineIgcFile | undefined
    for (const f of ctx.dossier.igcFiles) {
      if (f.unitId !== r.id) continue
      if (!best || later(f, best)) best = f
    }
    if (best) out.push({ unitId: r.id, label: `${r.model} (serial ${r.serial})`, file: best, title: `The IGC file from ${r.model} (serial ${r.serial})` })
  }
  let loose: EngineIgcFile | undefined
  for (const f of ctx.dossier.igcFiles) {
    if (f.unitId != null) continue
    if (!loose || later(f, loose)) loose = f
  }
  if (loose) out.push({ unitId: undefined, label: unattachedLabel(loose), file: loose, title: `The IGC file ${unattachedLabel(loose)}` })
  return out
}

/** "NIL" (any case) in a crew header means nobody (common practice of recorders' declarations). */
export function crewName(s: string | null | undefined): string | null {
  const v = (s ?? '').trim()
  return v === '' || /^nil$/i.test(v) ? null : v
}

export const declarationMatchesEntry: Check = {
  id: 'declaration.matches-entry',
  severity: 'blocking / advisory',
  source: 'IGC GNSS FR specification Appendix A, H records (HFPLT, HFCM2, HFGTY, HFGID, HFCID, HFCCL)',
  rule: 'In the latest IGC file from each recorder (and the latest uploaded without a recorder), glider ID = registration and competition ID = the entry’s (blocking); class, pilot, co-pilot and glider type match allowing for case, spacing, punctuation, diacritics and word order, a co-pilot “NIL” meaning none (advisory).',
  run(ctx) {
    const { entry } = ctx.dossier
    const aliases = ctx.competition.classLimits[entry.classCode]?.aliases ?? []
    const out: Finding[] = []
    for (const { unitId, title, file } of latestIgcFiles(ctx)) {
      const subject = file.id ? `igc:${file.id}` : undefined
      const block = (what: string, declared: string | null, expected: string, fixHint: string) => out.push({
        checkId: this.id, severity: 'blocking', unitId, subject, caution: HARDWARE_CAUTION,
        reason: declared
          ? `${title} declares ${what} “${declared}”, the entry says “${expected}”.`
          : `${title} declares no ${what.replace(/^the /, '')}; the entry says “${expected}”.`,
        fixHint,
      })
      const advise = (what: string, declared: string | null | undefined, expected: string) => out.push({
        checkId: this.id, severity: 'advisory', unitId, subject, caution: HARDWARE_CAUTION,
        reason: declared
          ? `${title} names the ${what} “${declared}”, the entry says “${expected}”.`
          : `${title} names no ${what}; the entry says “${expected}”.`,
        fixHint: `Set the ${what} in the recorder’s declaration (or correct the entry), then upload a new IGC file.`,
      })
      const redeclare = 'Correct the declaration in the recorder (or the entry, if the entry is wrong), then upload a new IGC file from it.'
      if (normaliseId(file.gliderId) !== normaliseId(entry.registration)) block('the glider ID', file.gliderId, entry.registration, redeclare)
      if (normaliseId(file.competitionId) !== normaliseId(entry.compId)) block('the competition ID', file.competitionId, entry.compId, redeclare)
      if (!classMatches(file.competitionClass, entry.classCode, entry.className, aliases)) advise('class', file.competitionClass, entry.className)
      if (!namesMatch(file.pilot, entry.pilotName)) advise('pilot', file.pilot, entry.pilotName)
      const copilot = crewName(file.copilot)
      if (entry.copilotName && !namesMatch(copilot, entry.copilotName)) advise('co-pilot', copilot, entry.copilotName)
      if (!entry.copilotName && copilot) {
        out.push({
          checkId: this.id, severity: 'advisory', unitId, subject, caution: HARDWARE_CAUTION,
          reason: `${title} names the co-pilot “${copilot}”; the entry has none.`,
          fixHint: 'Clear the co-pilot in the recorder’s declaration (or add the co-pilot to the entry), then upload a new IGC file.',
        })
      }
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
    for (const { unitId, title, file } of latestIgcFiles(ctx)) {
      if (file.flightDate && file.flightDate >= oldest) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId,
        subject: file.id ? `igc:${file.id}` : undefined,
        caution: HARDWARE_CAUTION,
        reason: file.flightDate
          ? `${title.replace(/^The /, 'The latest ')} is dated ${file.flightDate}, more than ${days} days before the first contest day (${first}).`
          : `${title.replace(/^The /, 'The latest ')} carries no flight date.`,
        fixHint: 'Make a short flight (or a ground recording, where the competition allows) with the recorder set up for this entry, and upload its IGC file.',
      })
    }
    return out
  },
}

export const DECLARATION_CHECKS = [declarationMatchesEntry, declarationRecent]
