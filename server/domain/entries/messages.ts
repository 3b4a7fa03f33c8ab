// Messages between an entrant and the office about one entry. The entrant asks for what only the
// office changes once the entry is accepted; the organisers are e-mailed and answer; the entrant
// is e-mailed the answer. Both read the thread on the entry page and in its timeline.
import type { Knex } from 'knex'
import { MESSAGES } from '#shared/constants/messages'
import type { EntryMessageBody } from '#shared/schemas/entry'
import type { EntryMessage } from '#shared/types/api-entries'
import { audit } from '#domain/audit/audit'
import { enqueueMail } from '#domain/mail/outbox'
import { renderMail } from '#domain/mail/templates'
import { iso } from '#domain/read-model/values'
import type { EntryAccess } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'

interface MessageRow { id: string, from_office: boolean, author_name: string, body: string, created_at: Date }

const toMessage = (r: MessageRow): EntryMessage => ({ id: r.id, fromOffice: r.from_office, authorName: r.author_name, body: r.body, at: iso(r.created_at)! })

/** The entry's messages, oldest first. */
export async function listEntryMessages(entryId: string, db: Knex = useDb()): Promise<EntryMessage[]> {
  const rows = await db('entry_messages as m').join('users as u', 'u.id', 'm.author_id')
    .where('m.entry_id', entryId).orderBy([{ column: 'm.created_at' }, { column: 'm.id' }])
    .select('m.id', 'm.from_office', 'u.name as author_name', 'm.body', 'm.created_at') as MessageRow[]
  return rows.map(toMessage)
}

/**
 * A message from the entrant to the office, or the office's answer (an organiser). Stored,
 * audited (ids only) and e-mailed in one transaction: to every organiser of the competition, or
 * to the entrant. Another member of the staff reads the thread but does not write in it.
 */
export async function postEntryMessage(access: EntryAccess, input: EntryMessageBody): Promise<EntryMessage> {
  const fromOffice = access.roles.includes('organiser') && !access.isOwner
  if (!fromOffice && !access.isOwner) throw httpError(403, MESSAGES.entryMessageWho)
  const { entry, competition, user } = access
  return useDb().transaction(async (trx) => {
    const [row] = await trx('entry_messages').insert({
      competition_id: competition.id, entry_id: entry.id, author_id: user.id, from_office: fromOffice, body: input.body,
    }).returning(['id', 'from_office', 'body', 'created_at']) as Omit<MessageRow, 'author_name'>[]
    await audit(trx, {
      actorUserId: user.id, competitionId: competition.id, action: 'entry.message', subjectType: 'entry', subjectId: entry.id,
      details: { entryId: entry.id, messageId: row!.id, fromOffice },
    })
    const entryUrl = `${siteUrl()}/competitions/${competition.id}/entries/${entry.id}`
    const recipients = fromOffice
      ? await trx('users').where({ id: entry.entrant_user_id }).select('email', 'name') as { email: string, name: string }[]
      : await trx('memberships as m').join('users as u', 'u.id', 'm.user_id')
        .where({ 'm.competition_id': competition.id, 'm.role': 'organiser' }).distinct('u.email', 'u.name') as { email: string, name: string }[]
    for (const to of recipients) {
      const mail = renderMail({
        greeting: `Hello ${to.name},`,
        paragraphs: fromOffice
          ? [`the office of ${competition.name} answered about your entry ${entry.comp_id} (${entry.registration}):`]
          : [`${user.name}, the entrant of ${entry.comp_id} (${entry.registration}), asks the office of ${competition.name}:`],
        list: [input.body],
        action: { label: fromOffice ? 'Read it on your entry' : 'Answer on the entry page', url: entryUrl },
      })
      await enqueueMail(trx, {
        to: to.email,
        subject: fromOffice ? `The office answered about ${entry.comp_id} — ${competition.name}` : `${entry.comp_id} asks the office — ${competition.name}`,
        text: mail.text,
        html: mail.html,
        template: fromOffice ? 'entry-message-answer' : 'entry-message',
        competitionId: competition.id,
        entryId: entry.id,
      })
    }
    return toMessage({ ...row!, author_name: user.name })
  })
}
