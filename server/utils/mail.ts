// Queues an e-mail in the outbox, inside the caller's transaction: the message exists
// exactly when the event it reports was committed. A worker sends it (with retries).
import type { Knex } from 'knex'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  html?: string
  template: string
  competitionId?: string | null
  entryId?: string | null
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
  }).returning('id')
  return String(row.id)
}
