// Appends to the audit log (append-only by a database trigger). Call it inside the same
// transaction as the change it records, so the two stand or fall together. Details never
// hold personal values (personal-fields.ts): what a caller passes goes through that filter.
import type { Knex } from 'knex'
import { withoutPersonalFields } from './personal-fields'

export interface AuditEntry {
  actorUserId: string | null
  competitionId?: string | null
  action: string
  subjectType: string
  subjectId?: string | null
  details?: Record<string, unknown>
}

/** The audit_log row of an entry, for a caller that writes it within a statement of its own. */
export function auditRow(entry: AuditEntry) {
  return {
    actor_user_id: entry.actorUserId,
    competition_id: entry.competitionId ?? null,
    action: entry.action,
    subject_type: entry.subjectType,
    subject_id: entry.subjectId ?? null,
    details: withoutPersonalFields(entry.details ?? {}),
  }
}

/** Appends one or more entries, in one statement. */
export async function audit(db: Knex, entries: AuditEntry | readonly AuditEntry[]): Promise<void> {
  const list = Array.isArray(entries) ? entries : [entries as AuditEntry]
  if (list.length) await db('audit_log').insert(list.map(auditRow))
}
