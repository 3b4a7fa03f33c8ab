// Pre-event reminders on the organiser's schedule (settings.reminderDays, default 30, 14 and 3
// days before the first contest day; shared/utils/reminder-schedule.ts decides which is due):
// - a submitted or accepted entry with open findings gets each reminder once, listing what is
//   open (the check engine's findings after competition-wide waivers, with fix hints, cautions
//   and a link to each rule); an entry with nothing open for the pilot gets none;
// - a draft gets a "finish your entry" reminder on the same days, listing what submitting still
//   needs, while registration is open;
// - a withdrawn or rejected entry gets nothing.
// Only the latest reminder due is sent: a run after days without one sends no burst of missed
// reminders. mail_reminders (entry, kind such as `pre-event-30` or `draft-14`) keeps each to
// exactly once however often, or however many at once, the job runs: a reminder is claimed
// before it is queued, in the transaction that queues and audits it.
import type { Knex } from 'knex'
import type { ReminderRunResult } from '#shared/types/api-mail'
import type { EntryRow } from '#shared/types/rows'
import type { Finding } from '#shared/engine'
import { dateInZone, daysBetween } from '#shared/engine/dates'
import { entryProgress } from '#shared/utils/entry-progress'
import { entryVerdict } from '#shared/utils/entry-verdict'
import { reminderOpenItems } from '#shared/utils/reminder-items'
import { dueReminder, reminderKind, reminderKindDays, reminderScheduleOf, type ReminderFamily } from '#shared/utils/reminder-schedule'
import { rulesOf } from '#shared/utils/rules'
import { audit } from '#domain/audit/audit'
import { findingsByEntry } from '#domain/findings/findings'
import { actionsQuery, toTileAction, type BoardActionRow } from '#domain/read-model/day-inputs'
import { num } from '#domain/read-model/values'
import { useDb } from '#server/utils/db'
import { siteUrl } from '#server/utils/site-url'
import { enqueueMail } from './outbox'
import { reminderMail, ruleLink } from './templates'
import { draftReminderMail } from './templates-office'

interface CompetitionToRemind {
  id: string
  name: string
  time_zone: string
  first_contest_day: string
  registration_closes_on: string | null
  settings: unknown
}

type ReminderEntryRow = EntryRow & { email: string, entrant_name: string }

interface Candidate {
  entry: ReminderEntryRow
  family: ReminderFamily
  daysBefore: number
}

/** Runs the job as of `now` (the admin route passes a chosen instant; the timer, the clock). */
export async function runReminders(now: Date = new Date()): Promise<ReminderRunResult> {
  const db = useDb()
  const competitions: CompetitionToRemind[] = await db('competitions as c')
    .whereNotNull('c.first_contest_day')
    .whereRaw(`(?::timestamptz AT TIME ZONE c.time_zone)::date < c.first_contest_day`, [now.toISOString()])
    .select('c.id', 'c.name', 'c.time_zone', 'c.first_contest_day', 'c.registration_closes_on', 'c.settings')

  const reminders: ReminderRunResult['reminders'] = []
  for (const c of competitions) {
    // The competition's own calendar day decides, so "30 days before" means the same there.
    const today = dateInZone(now, c.time_zone)
    const schedule = reminderScheduleOf(c.settings)
    if (dueReminder(schedule, c.first_contest_day, today) === null) continue
    await db.transaction(async (trx) => {
      reminders.push(...await remindCompetition(trx, c, schedule, today))
    })
  }
  return { queued: reminders.length, entryIds: reminders.map(r => r.entryId), reminders }
}

async function remindCompetition(trx: Knex, c: CompetitionToRemind, schedule: number[], today: string): Promise<ReminderRunResult['reminders']> {
  const draftsOpen = !c.registration_closes_on || today <= c.registration_closes_on
  const entries: ReminderEntryRow[] = await trx('entries as e')
    .join('users as u', 'u.id', 'e.entrant_user_id')
    .where('e.competition_id', c.id)
    .whereIn('e.status', draftsOpen ? ['draft', 'submitted', 'accepted'] : ['submitted', 'accepted'])
    .orderBy('e.created_at')
    .select('e.*', 'u.email', 'u.name as entrant_name')
  if (!entries.length) return []

  const sent: { entry_id: string, kind: string }[] = await trx('mail_reminders').whereIn('entry_id', entries.map(e => e.id)).select('entry_id', 'kind')
  const candidates: Candidate[] = []
  for (const entry of entries) {
    const family: ReminderFamily = entry.status === 'draft' ? 'draft' : 'pre-event'
    const sentDays = sent.filter(s => s.entry_id === entry.id).map(s => reminderKindDays(family, s.kind)).filter(d => d !== null)
    const daysBefore = dueReminder(schedule, c.first_contest_day, today, sentDays)
    if (daysBefore !== null) candidates.push({ entry, family, daysBefore })
  }
  if (!candidates.length) return []

  const base = siteUrl()
  const daysLeft = daysBetween(today, c.first_contest_day)
  const entered = candidates.filter(x => x.family === 'pre-event').map(x => x.entry.id)
  const drafts = candidates.filter(x => x.family === 'draft').map(x => x.entry.id)
  const [findings, waivers, units] = await Promise.all([
    entered.length ? findingsByEntry(c.id, entered, trx) : new Map<string, Finding[]>(),
    entered.length ? actionsQuery(trx, c.id, c.first_contest_day, entered) as Promise<BoardActionRow[]> : [],
    drafts.length ? trx('units').whereIn('entry_id', drafts).orderBy('created_at').select('id', 'entry_id', 'kind', 'model', 'serial', 'approval_level') : [],
  ])

  const queued: ReminderRunResult['reminders'] = []
  for (const { entry, family, daysBefore } of candidates) {
    const url = `${base}/competitions/${c.id}/entries/${entry.id}`
    let mail: ReturnType<typeof reminderMail>
    let details: Record<string, unknown>
    if (family === 'pre-event') {
      // Without a day, only the director's waivers for the whole competition count.
      const verdict = entryVerdict({
        status: entry.status,
        findings: findings.get(entry.id) ?? [],
        actions: waivers.filter(w => w.entry_id === entry.id).map(toTileAction),
      })
      // Nothing for the pilot to do (a document in review is the scrutineers' to act on): no reminder.
      if (!verdict.pilot.length && !verdict.advisory.length) continue
      const open = [...verdict.pilot, ...verdict.inReview, ...verdict.advisory]
      const items = reminderOpenItems({ status: entry.status }, open)
      mail = reminderMail({
        competitionName: c.name,
        firstContestDay: c.first_contest_day,
        daysLeft,
        pilotName: entry.pilot_name,
        compId: entry.comp_id,
        openItems: items.map(i => ({ text: i.text, link: i.checkId ? ruleLink(base, c.id, i.checkId) : undefined })),
        url,
      })
      details = { kind: reminderKind(family, daysBefore), daysBefore, openItems: items.length, findings: open.map(f => f.checkId) }
    }
    else {
      const progress = entryProgress({
        entry: {
          status: entry.status,
          pilotName: entry.pilot_name,
          pilotNationality: entry.pilot_nationality,
          pilotLicenceNumber: entry.pilot_licence_number,
          pilotPhone: entry.pilot_phone,
          emergencyContact: entry.emergency_contact,
          gliderType: entry.glider_type,
          registration: entry.registration,
          compId: entry.comp_id,
          spanM: num(entry.span_m),
          mtomKg: num(entry.mtom_kg),
          emptyMassKg: num(entry.empty_mass_kg),
        },
        units: units.filter(u => u.entry_id === entry.id).map(u => ({ id: u.id, kind: u.kind, model: u.model, serial: u.serial, approvalLevel: u.approval_level })),
        rules: rulesOf(c.settings),
        // Only what blocks submitting is listed, and documents, IGC files and the fee never do.
        documents: [],
        igcFiles: [],
        paymentStatus: entry.payment_status,
      })
      const needed = progress.missing.filter(m => m.blocksSubmit).map(m => m.text)
      mail = draftReminderMail({
        competitionName: c.name,
        firstContestDay: c.first_contest_day,
        daysLeft,
        registrationClosesOn: c.registration_closes_on,
        entrantName: entry.entrant_name,
        compId: entry.comp_id,
        needed,
        url,
      })
      details = { kind: reminderKind(family, daysBefore), daysBefore, needed: progress.missing.filter(m => m.blocksSubmit).map(m => m.key) }
    }

    // Claim first: a second run at the same time skips the reminder this one claimed.
    const kind = reminderKind(family, daysBefore)
    const claimed = await trx('mail_reminders').insert({ entry_id: entry.id, kind }).onConflict(['entry_id', 'kind']).ignore().returning('entry_id')
    if (!claimed.length) continue
    const outboxId = await enqueueMail(trx, {
      to: entry.email,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      template: family === 'draft' ? 'draft-reminder' : 'pre-event-reminder',
      competitionId: c.id,
      entryId: entry.id,
    })
    await trx('mail_reminders').where({ entry_id: entry.id, kind }).update({ outbox_id: outboxId })
    await audit(trx, {
      actorUserId: null,
      competitionId: c.id,
      action: 'reminder.queue',
      subjectType: 'entry',
      subjectId: entry.id,
      details,
    })
    queued.push({ entryId: entry.id, kind })
  }
  return queued
}
