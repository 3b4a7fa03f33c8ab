// The pre-event reminder: N days (competition setting reminderDaysBefore, default 14) before
// the first contest day, one e-mail per submitted or accepted entry listing what is still open:
// the check engine's findings (server/domain/findings/findings.ts), with fix hints and cautions,
// each linked to its rule on the competition's rulebook page.
// mail_reminders keeps it to exactly once per entry, however often the job runs.
import type { ReminderRunResult } from '#shared/types/api-mail'
import { reminderOpenItems } from '#shared/utils/reminder-items'
import { audit } from '#domain/audit/audit'
import { findingsByEntry } from '#domain/findings/findings'
import { useDb } from '#server/utils/db'
import { siteUrl } from '#server/utils/site-url'
import { enqueueMail } from './outbox'
import { reminderMail, ruleLink } from './templates'

export const DEFAULT_REMINDER_DAYS_BEFORE = 14
const KIND = 'pre-event'

export async function runReminders(now: Date = new Date()): Promise<ReminderRunResult> {
  const db = useDb()
  // The competition's own calendar day decides, so "14 days before" means the same there.
  const competitions: { id: string, name: string, first_contest_day: string }[] = await db('competitions as c')
    .whereNotNull('c.first_contest_day')
    .whereRaw(`(?::timestamptz AT TIME ZONE c.time_zone)::date < c.first_contest_day`, [now.toISOString()])
    .whereRaw(`(?::timestamptz AT TIME ZONE c.time_zone)::date >= c.first_contest_day - (
      CASE WHEN c.settings->>'reminderDaysBefore' ~ '^[0-9]{1,3}$' THEN (c.settings->>'reminderDaysBefore')::int ELSE ? END)`,
    [now.toISOString(), DEFAULT_REMINDER_DAYS_BEFORE])
    .select(
      'c.id', 'c.name',
      'c.first_contest_day',
    )

  const base = siteUrl()
  const entryIds: string[] = []
  for (const c of competitions) {
    await db.transaction(async (trx) => {
      const entries = await trx('entries as e')
        .join('users as u', 'u.id', 'e.entrant_user_id')
        .where('e.competition_id', c.id)
        .whereIn('e.status', ['submitted', 'accepted'])
        .whereNotExists(trx('mail_reminders as r').whereRaw('r.entry_id = e.id').where('r.kind', KIND))
        .select('e.id', 'e.status', 'e.pilot_name', 'e.comp_id', 'u.email')
      if (!entries.length) return
      const findings = await findingsByEntry(c.id, entries.map(e => e.id as string), trx)

      for (const e of entries) {
        // Claim first: a second job running at the same time skips the entry.
        const claimed = await trx('mail_reminders').insert({ entry_id: e.id, kind: KIND }).onConflict(['entry_id', 'kind']).ignore().returning('entry_id')
        if (!claimed.length) continue
        const openItems = reminderOpenItems({ status: e.status }, findings.get(e.id) ?? [])
        const mail = reminderMail({
          competitionName: c.name,
          firstContestDay: c.first_contest_day,
          pilotName: e.pilot_name,
          compId: e.comp_id,
          openItems: openItems.map(i => ({ text: i.text, link: i.checkId ? ruleLink(base, c.id, i.checkId) : undefined })),
          url: `${base}/competitions/${c.id}/entries/${e.id}`,
        })
        const outboxId = await enqueueMail(trx, { to: e.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'pre-event-reminder', competitionId: c.id, entryId: e.id })
        await trx('mail_reminders').where({ entry_id: e.id, kind: KIND }).update({ outbox_id: outboxId })
        await audit(trx, {
          actorUserId: null,
          competitionId: c.id,
          action: 'reminder.queue',
          subjectType: 'entry',
          subjectId: e.id,
          details: { kind: KIND, openItems: openItems.length },
        })
        entryIds.push(e.id)
      }
    })
  }
  return { queued: entryIds.length, entryIds }
}
