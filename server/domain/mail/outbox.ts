// Queues an e-mail in the outbox, inside the caller's transaction: the message exists
// exactly when the event it reports was committed. A worker sends it (with retries).
import type { Knex } from 'knex'
import type { EntryMailItem } from '#shared/types/api-mail'
import { useDb } from '#server/utils/db'
import { iso } from '#domain/read-model/values'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  html?: string
  template: string
  competitionId?: string | null
  entryId?: string | null
  /** The body carries a one-time link (an invitation): it is emptied once the message is sent. */
  secret?: boolean
}

/** Returns the outbox row's id. */
export async function enqueueMail(db: Knex, mail: OutgoingMail): Promise<string> {
  const [row] = await db('mail_outbox').insert({
    to_address: mail.to,
    subject: mail.subject,
    text_body: mail.text,
    html_body: mail.html ?? null,
    template: mail.template,
    competition_id: mail.competitionId ?? null,
    entry_id: mail.entryId ?? null,
    secret_body: mail.secret ?? false,
  }).returning('id')
  return String(row.id)
}

/** Every e-mail queued about one entry, newest first: what was sent, and what still waits. */
export async function entryMailLog(entryId: string, db: Knex = useDb()): Promise<EntryMailItem[]> {
  const rows = await db('mail_outbox').where({ entry_id: entryId }).orderBy([{ column: 'created_at', order: 'desc' }, { column: 'id', order: 'desc' }])
    .select('id', 'to_address', 'subject', 'template', 'created_at', 'sent_at', 'attempts', 'last_error')
  return rows.map(r => ({
    id: String(r.id),
    to: r.to_address,
    subject: r.subject,
    template: r.template,
    queuedAt: iso(r.created_at),
    sentAt: iso(r.sent_at),
    attempts: r.attempts,
    lastError: r.last_error,
  }))
}
