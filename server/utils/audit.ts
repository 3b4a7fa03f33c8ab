// Appends to the audit log (append-only by a database trigger). Call it inside the same
// transaction as the change it records, so the two stand or fall together.
import type { Knex } from 'knex'

export interface AuditEntry {
  actorUserId: string | null
  competitionId?: string | null
  action: string
  subjectType: string
  subjectId?: string | null
  details?: Record<string, unknown>
}

export async function audit(db: Knex, entry: AuditEntry): Promise<void> {
  await db('audit_log').insert({
    actor_user_id: entry.actorUserId,
    competition_id: entry.competitionId ?? null,
    action: entry.action,
    subject_type: entry.subjectType,
    subject_id: entry.subjectId ?? null,
    details: entry.details ?? {},
  })
}
