// Erasing an account pseudonymises its audit rows: what was done, when, and that one and the same
// account did it, stay; who the person was goes.
//
// The actor stays `actor_user_id`, the account's own row, which the erasure anonymises ("Deleted
// account", a placeholder address, no password). That row is the pseudonym: stable, known to
// nothing outside the database, and the same id the grid checks, tags and reviews of that
// account point at, so the log still agrees with them. (A fresh random id in the log alone would
// hide nothing those rows do not already show, and would break that agreement.)
//
// The details of the rows about the person — those they wrote, those about their account and
// those about their entries — lose any personal value still in them: their name and address,
// and their entries' pilot names, licence numbers, phones and emergency contacts wherever quoted
// (rows written before the log stopped keeping them; finding reasons quoting a name). Only
// `audit_log_forget` may rewrite them (the append-only trigger allows nothing else).
import type { Knex } from 'knex'
import { withoutPersonalFields, withoutPersonalValues } from './personal-fields'

export interface ForgottenPerson {
  userId: string
  /** Their entries, whose rows are about them too. */
  entryIds: readonly string[]
  /** What must not be left quoted: their name, address, and their entries' personal values as stored. */
  values: readonly (string | null | undefined)[]
}

/** Rewrites the details of the person's audit rows in the caller's transaction; returns how many changed. */
export async function forgetPersonInAudit(trx: Knex.Transaction, person: ForgottenPerson): Promise<number> {
  const entryIds = [...person.entryIds]
  const rows: { id: string, details: Record<string, unknown> }[] = await trx('audit_log')
    .where(q => q.where('actor_user_id', person.userId)
      .orWhere(s => s.where({ subject_type: 'user', subject_id: person.userId }))
      .orWhere(s => s.where('subject_type', 'entry').whereIn('subject_id', entryIds))
      .orWhereRaw(`details->>'entryId' = ANY(?)`, [entryIds]))
    .orderBy('id').select('id', 'details')
  const ids: string[] = []
  const details: string[] = []
  for (const row of rows) {
    const after = withoutPersonalValues(withoutPersonalFields(row.details ?? {}), person.values)
    const json = JSON.stringify(after)
    if (json === JSON.stringify(row.details)) continue
    ids.push(row.id)
    details.push(json)
  }
  if (!ids.length) return 0
  const { rows: [done] } = await trx.raw('SELECT audit_log_forget(?::bigint[], ?::jsonb[]) AS n', [ids, details]) as { rows: { n: number }[] }
  return Number(done!.n)
}
