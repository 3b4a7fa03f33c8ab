// Findings: the check engine (shared/engine) run over the dossiers the read model loads —
// one entry's for its page, a few for an entrant's list, the whole competition's for the
// staff's tables, exports and the pre-event reminder.
import { entryVerdict } from '#shared/utils/entry-verdict'
import type { Knex } from 'knex'
import { blockingFirst, evaluate, type Finding } from '#shared/engine'
import type { CompetitionFindings, EntryFindings, FindingCounts } from '#shared/types/api-findings'
import { useDb } from '#server/utils/db'
import { loadCompetitionDossiers, type FindingsEntryRow } from '#domain/read-model/dossiers'

export interface EvaluatedEntry {
  row: FindingsEntryRow
  findings: Finding[]
}

/**
 * Findings counted as every screen counts them (`entryVerdict`, competition-wide waivers aside):
 * the pilot's blocking ones, those waiting for review, advisory.
 */
export function countFindings(findings: readonly Finding[]): FindingCounts {
  const v = entryVerdict({ status: 'accepted', findings })
  return { blocking: v.pilot.length, advisory: v.advisory.length, inReview: v.inReview.length }
}

/**
 * Evaluates the entries of one competition: every entry, or only `entryIds` (the field
 * still holds every entry, so uniqueness checks see the whole competition). Entries in the
 * order of their competition ID.
 */
export async function evaluateCompetition(competitionId: string, entryIds?: readonly string[], db: Knex = useDb()): Promise<EvaluatedEntry[]> {
  if (entryIds && !entryIds.length) return []
  const loaded = await loadCompetitionDossiers(competitionId, { entryIds }, db)
  if (!loaded) return []
  const { competition, dossiers, field, rows } = loaded
  return dossiers.map((d, i) => ({ row: rows[i]!, findings: competition ? blockingFirst(evaluate(d, competition, field)) : [] }))
}

/** The findings of one entry (blocking first). */
export async function entryFindings(competitionId: string, entryId: string, db: Knex = useDb()): Promise<EntryFindings> {
  const [hit] = await evaluateCompetition(competitionId, [entryId], db)
  const findings = hit?.findings ?? []
  return { entryId, findings, ...countFindings(findings) }
}

/** Findings by entry id for some entries of one competition (all when entryIds is left out). */
export async function findingsByEntry(competitionId: string, entryIds?: readonly string[], db: Knex = useDb()): Promise<Map<string, Finding[]>> {
  const evaluated = await evaluateCompetition(competitionId, entryIds, db)
  return new Map(evaluated.map(e => [e.row.id, e.findings]))
}

/** The whole competition for its staff: findings by entry, counts by check and severity. */
export function summariseFindings(evaluated: readonly EvaluatedEntry[]): CompetitionFindings {
  const byCheck: CompetitionFindings['byCheck'] = {}
  const bySeverity = { blocking: 0, advisory: 0 }
  const entries = evaluated.map(({ row, findings }) => {
    for (const f of findings) {
      const c = (byCheck[f.checkId] ??= { blocking: 0, advisory: 0 })
      c[f.severity]++
      bySeverity[f.severity]++
    }
    return { entryId: row.id, compId: row.comp_id, pilotName: row.pilot_name, status: row.status, findings, ...countFindings(findings) }
  })
  return { entries, byCheck, bySeverity }
}
