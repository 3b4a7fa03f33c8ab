// evaluate(dossier, competition, field, day?) → findings: every check of the catalogue, in
// catalogue order, each check's findings in the order of the dossier's units and documents.
// Pure: no clock, no database, the same input always gives the same output.
import { CATALOGUE } from './catalogue'
import { buildField } from './field'
import type { CompetitionForEngine, Dossier, Field, Finding, IsoDate } from './types'

export function evaluate(dossier: Dossier, competition: CompetitionForEngine, field: Field, day?: IsoDate): Finding[] {
  const ctx = { dossier, competition, field, day }
  const out: Finding[] = []
  for (const check of CATALOGUE) {
    for (const f of check.run(ctx)) out.push(f)
  }
  return out
}

/** Blocking findings first, otherwise in catalogue order (for display). */
export function blockingFirst(findings: readonly Finding[]): Finding[] {
  return [...findings.filter(f => f.severity === 'blocking'), ...findings.filter(f => f.severity === 'advisory')]
}

/** Every dossier of a competition against one field built from them all: findings by entry id. */
export function evaluateAll(dossiers: readonly Dossier[], competition: CompetitionForEngine, day?: IsoDate): Map<string, Finding[]> {
  const field = buildField(dossiers)
  const out = new Map<string, Finding[]>()
  for (const d of dossiers) out.set(d.entry.id, evaluate(d, competition, field, day))
  return out
}
