// The e-mails of the competition office's paperwork that have a file of their own: a withdrawal
// (the entrant's confirmation, and the organisers' notice with the refund due) and the
// "finish your entry" reminder to a draft. Pure functions over renderMail, like templates.ts.
import { mailDay, renderMail, type RenderedMail } from './templates'

const OFFICE_FOOTER = 'Gridmark, for the competition office. This message was sent automatically; replies are not read.'

/**
 * The e-mail to an entrant whose entry was withdrawn: by themselves (a confirmation), or by the
 * office for them, with the office's reason. It says what happens to a fee paid.
 */
export function entryWithdrawnMail(input: {
  entrantName: string
  entryLabel: string
  compId: string
  competitionName: string
  /** The office withdrew it for the pilot, with this reason; absent when the entrant did. */
  byOffice?: { name: string, reason: string }
  /** Money received for the entry (net of refunds), as written ("€300.00"), or null when none was paid. */
  paid: string | null
  entryUrl: string
}): RenderedMail & { subject: string } {
  const paragraphs = input.byOffice
    ? [
        `the competition office (${input.byOffice.name}) has withdrawn your entry ${input.entryLabel} from ${input.competitionName} for you.`,
        `Their reason: ${input.byOffice.reason}`,
      ]
    : [`your entry ${input.entryLabel} in ${input.competitionName} is withdrawn, as you asked. Its competition ID ${input.compId} is free for another entry.`]
  paragraphs.push(
    input.paid
      ? `You paid ${input.paid} for this entry. The office has been told; any refund is theirs to decide and you will get an e-mail when one is made.`
      : 'No entry fee was paid for this entry, so nothing is owed either way.',
    'A withdrawal is final. If this is a mistake, ask the office.',
  )
  return {
    subject: `Entry ${input.compId} withdrawn — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs,
      action: { label: 'Open your entry', url: input.entryUrl },
      footer: OFFICE_FOOTER,
    }),
  }
}

/** The e-mail to each organiser when an entry is withdrawn: which entry, by whom, and the refund due. */
export function entryWithdrawnOfficeMail(input: {
  pilotName: string
  entryLabel: string
  compId: string
  competitionName: string
  /** Who withdrew it: the entrant (their name), or an organiser for the pilot, with the reason. */
  withdrawnBy: { name: string, office: boolean, reason?: string }
  /** Money received for the entry (net of refunds), as written, or null when none was paid. */
  refundDue: string | null
  /** The entry's payments, where a refund is made. */
  paymentsUrl: string
}): RenderedMail & { subject: string } {
  const who = input.withdrawnBy.office
    ? `${input.withdrawnBy.name} withdrew the entry ${input.entryLabel} (pilot ${input.pilotName}) from ${input.competitionName} for the pilot.`
    : `${input.withdrawnBy.name} withdrew their entry ${input.entryLabel} (pilot ${input.pilotName}) from ${input.competitionName}.`
  const paragraphs = [who]
  if (input.withdrawnBy.reason) paragraphs.push(`The reason given: ${input.withdrawnBy.reason}`)
  paragraphs.push(
    input.refundDue
      ? `Refund due: ${input.refundDue}, the money received for this entry. Refund it, or part of it, under the competition's rules from the entry's payments.`
      : 'Refund due: none, no fee was paid for this entry.',
    'The entry has left the board and its competition ID is free again.',
  )
  return {
    subject: `Entry ${input.compId} withdrawn — refund due: ${input.refundDue ?? 'none'} — ${input.competitionName}`,
    ...renderMail({
      paragraphs,
      action: { label: input.refundDue ? 'Open the entry’s payments' : 'Open the entry', url: input.paymentsUrl },
      footer: OFFICE_FOOTER,
    }),
  }
}

/**
 * The "finish your entry" reminder to a draft, on the same schedule as the pre-event reminder:
 * what submitting still needs, or that it only waits to be submitted.
 */
export function draftReminderMail(input: {
  competitionName: string
  firstContestDay: string
  /** Days left until the first contest day, as the reminder is sent. */
  daysLeft?: number
  registrationClosesOn: string | null
  entrantName: string
  compId: string | null
  /** What submitting still needs (entryProgress's items that block submitting). */
  needed: string[]
  url: string
}): RenderedMail & { subject: string } {
  const day = mailDay(input.firstContestDay) ?? input.firstContestDay
  const lead = input.daysLeft ? ` (in ${input.daysLeft} ${input.daysLeft === 1 ? 'day' : 'days'})` : ''
  const closes = input.registrationClosesOn ? ` Registration closes on ${mailDay(input.registrationClosesOn)}.` : ''
  return {
    subject: `Finish your entry: ${input.competitionName} starts on ${day}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `${input.competitionName} starts on ${day}${lead}. Your entry${input.compId ? ` ${input.compId}` : ''} is still a draft: the organiser cannot review it until you submit it.${closes}`,
        input.needed.length
          ? 'Before you can submit it, the entry still needs:'
          : 'It has everything submitting needs: open it and submit it.',
      ],
      list: input.needed,
      action: { label: 'Finish your entry', url: input.url },
      footer: OFFICE_FOOTER,
    }),
  }
}
