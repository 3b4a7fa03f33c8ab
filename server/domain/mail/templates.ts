// The plain layout every e-mail shares (a text part and a simple HTML part saying the same),
// and the templates of the mail area. Other areas build their messages with renderMail(); a
// message that lists findings links each to its rule on the competition's rulebook page.
import { ROLE_LABELS } from '#shared/constants/roles'
import type { InvitableRole } from '#shared/constants/invitations'
import { HARDWARE_CAUTION, type Finding } from '#shared/engine'
import { rulebookPath } from '#shared/utils/rulebook'
import type { PaymentMethod, RecordedPaymentMethod } from '#shared/constants/payments'

export interface MailAction {
  label: string
  url: string
}

/** A bulleted line with a small link under it (a finding and its rule). */
export interface MailListItem {
  text: string
  link?: MailAction
}

export interface MailContent {
  greeting?: string
  paragraphs: string[]
  /** Bulleted lines shown after the paragraphs (e.g. what is still missing). */
  list?: (string | MailListItem)[]
  /** Paragraphs after the list (e.g. the caution that applies to it). */
  closing?: string[]
  action?: MailAction
  footer?: string
}

export interface RenderedMail {
  text: string
  html: string
}

const DEFAULT_FOOTER = 'Gridmark — the scrutineering desk of your competition. This message was sent automatically; replies are not read.'

function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;')
}

export function renderMail(content: MailContent): RenderedMail {
  const footer = content.footer ?? DEFAULT_FOOTER
  const text: string[] = []
  if (content.greeting) text.push(content.greeting, '')
  for (const p of content.paragraphs) text.push(p, '')
  const list = (content.list ?? []).map(item => (typeof item === 'string' ? { text: item } : item))
  if (list.length) {
    for (const item of list) {
      text.push(`  - ${item.text}`)
      if (item.link) text.push(`    ${item.link.label}`, `    ${item.link.url}`)
    }
    text.push('')
  }
  for (const c of content.closing ?? []) text.push(c, '')
  if (content.action) text.push(`${content.action.label}:`, content.action.url, '')
  text.push('-- ', footer)

  const p = 'margin:0 0 16px 0;'
  const html: string[] = [
    '<!doctype html><html lang="en"><body style="margin:0;padding:24px;background:#f5f7fa;font-family:Helvetica,Arial,sans-serif;color:#0e1f3b;font-size:16px;line-height:1.5">',
    '<div style="max-width:560px;margin:0 auto;background:#ffffff;border-radius:8px;padding:24px">',
    '<p style="margin:0 0 20px 0;font-weight:800;letter-spacing:0.04em">GRIDMARK</p>',
  ]
  if (content.greeting) html.push(`<p style="${p}">${escapeHtml(content.greeting)}</p>`)
  for (const para of content.paragraphs) html.push(`<p style="${p}">${escapeHtml(para)}</p>`)
  if (list.length) {
    html.push(`<ul style="${p}padding-left:20px">`, ...list.map(item => `<li style="margin:0 0 8px 0">${escapeHtml(item.text)}${item.link
      ? `<br><a href="${escapeHtml(item.link.url)}" style="color:#0f766e;font-size:14px">${escapeHtml(item.link.label)}</a>`
      : ''}</li>`), '</ul>')
  }
  for (const c of content.closing ?? []) html.push(`<p style="${p}">${escapeHtml(c)}</p>`)
  if (content.action) {
    const url = escapeHtml(content.action.url)
    html.push(
      `<p style="${p}"><a href="${url}" style="display:inline-block;background:#0f766e;color:#ffffff;text-decoration:none;font-weight:700;padding:12px 20px;border-radius:6px">${escapeHtml(content.action.label)}</a></p>`,
      `<p style="${p}font-size:14px;color:#475569">If the button does not work, copy this address into your browser:<br><a href="${url}" style="color:#0f766e">${url}</a></p>`,
    )
  }
  html.push(`<p style="margin:24px 0 0 0;font-size:13px;color:#64748b">${escapeHtml(footer)}</p>`, '</div></body></html>')
  return { text: text.join('\n'), html: html.join('\n') }
}

/** A finding's rule on the competition's rulebook page, as a link from an e-mail (`base`: siteUrl()). */
export function ruleLink(base: string, competitionId: string, checkId: string): MailAction {
  return { label: `Rule: ${checkId}`, url: `${base}${rulebookPath(competitionId, checkId)}` }
}

/**
 * Findings as the lines of an e-mail: severity, what is wrong and how to fix it, each with its
 * rule. A finding whose fix touches hardware points to the caution the message ends with.
 */
export function findingItems(findings: readonly Finding[], base: string, competitionId: string): MailListItem[] {
  return findings.map(f => ({
    text: `${f.severity === 'blocking' ? 'Blocking' : 'Advisory'}: ${f.reason} How to fix: ${f.fixHint}${f.caution ? ' The fix touches hardware: read the caution below.' : ''}`,
    link: ruleLink(base, competitionId, f.checkId),
  }))
}

/**
 * The e-mail to an entrant whose glider is held or released: what happened, the findings open
 * on the entry (each with its rule), and the hardware caution in full. The caution is always
 * there, not only under a finding that carries one: a hold is often for something no finding
 * names (the director's reason, a checklist item failed on the grid: antennas, ballast), and it
 * is read while the glider is put right in a hurry on the grid.
 */
export function readinessMail(input: {
  greeting: string
  paragraphs: string[]
  findings: readonly Finding[]
  competitionId: string
  base: string
  entryUrl: string
}): RenderedMail {
  const { findings } = input
  return renderMail({
    greeting: input.greeting,
    paragraphs: findings.length
      ? [...input.paragraphs, findings.length === 1 ? 'The checks find this on your entry now:' : 'The checks find these on your entry now:']
      : input.paragraphs,
    list: findingItems(findings, input.base, input.competitionId),
    closing: [
      'Talk to the scrutineers on the grid or the contest director.',
      `Caution where a fix touches hardware: ${HARDWARE_CAUTION}`,
    ],
    action: { label: 'Open your entry', url: input.entryUrl },
  })
}

function formatDay(isoDate: string | null): string | null {
  if (!isoDate) return null
  const [y, m, d] = isoDate.split('-').map(Number)
  return new Date(Date.UTC(y!, m! - 1, d!)).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
}

export function invitationMail(input: {
  competitionName: string
  role: InvitableRole
  invitedByName: string | null
  url: string
  expiresAt: Date
}): RenderedMail & { subject: string } {
  const role = ROLE_LABELS[input.role].toLowerCase()
  const who = input.invitedByName ? `${input.invitedByName} invites you` : 'You are invited'
  const expires = input.expiresAt.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
  return {
    subject: `Invitation: ${role} at ${input.competitionName}`,
    ...renderMail({
      greeting: 'Hello,',
      paragraphs: [
        `${who} to join ${input.competitionName} on Gridmark as ${role}.`,
        'Open the link to accept. If you have no Gridmark account yet, you can create one on the way; the invitation works with a new or an existing account.',
        `The link works once and holds until ${expires}. If you did not expect this invitation, ignore this message.`,
      ],
      action: { label: 'Open the invitation', url: input.url },
    }),
  }
}

export function reminderMail(input: {
  competitionName: string
  firstContestDay: string
  /** Days left until the first contest day, as the reminder is sent. */
  daysLeft?: number
  pilotName: string
  compId: string
  openItems: (string | MailListItem)[]
  url: string
}): RenderedMail & { subject: string } {
  const day = formatDay(input.firstContestDay) ?? input.firstContestDay
  const lead = input.daysLeft ? ` (in ${input.daysLeft} ${input.daysLeft === 1 ? 'day' : 'days'})` : ''
  const paragraphs = [
    `${input.competitionName} starts on ${day}${lead}. This is a reminder about your entry ${input.compId} (${input.pilotName}).`,
  ]
  if (input.openItems.length) {
    paragraphs.push('These points are still open on your entry. Fixing them before you arrive saves time at scrutineering:')
  }
  else {
    paragraphs.push('Nothing is open on your entry at the moment. Please check it once more before you travel.')
  }
  return {
    subject: `Reminder: ${input.competitionName} starts on ${day}`,
    ...renderMail({
      greeting: `Hello ${input.pilotName},`,
      paragraphs,
      list: input.openItems,
      action: { label: 'Open your entry', url: input.url },
      footer: 'Gridmark assists the scrutineers and does not replace their judgement; the competition’s rules and local procedures prevail. This message was sent automatically.',
    }),
  }
}

/** A date as the e-mails write it: 12 July 2027 (a YYYY-MM-DD date, or null). */
export function mailDay(isoDate: string | null): string | null {
  return formatDay(isoDate)
}

/**
 * The e-mail to an entrant when the director waives one finding of their entry, or withdraws
 * that waiver: the check in words with its rule, the finding as it read, for which day or the
 * whole competition, who decided and why, and the entry page where they see it.
 */
export function waiverMail(input: {
  event: 'granted' | 'withdrawn'
  entrantName: string
  compId: string
  competitionName: string
  competitionId: string
  checkId: string
  /** The check's rule in words. */
  checkRule: string
  /** The finding as it read when waived. */
  finding: string | null
  scope: 'day' | 'competition'
  day: string | null
  /** The last contest day, which a waiver of the whole competition runs to. */
  lastContestDay: string | null
  /** The director who granted the waiver, and their reason. */
  grantedBy: string
  grantReason: string
  /** For a withdrawal: who withdrew it and why. */
  withdrawnBy?: string
  withdrawalReason?: string
  /** After a withdrawal: whether the finding holds the glider again on the open day. */
  heldAgain?: boolean
  base: string
  entryUrl: string
}): RenderedMail & { subject: string } {
  const scope = input.scope === 'day'
    ? `for ${formatDay(input.day) ?? 'the day'} only`
    : `for the whole competition${input.lastContestDay ? ` (to ${formatDay(input.lastContestDay)})` : ''}`
  const what = `${input.checkRule}${input.finding ? ` What the check found: ${input.finding}` : ''}`
  if (input.event === 'granted') {
    return {
      subject: `A finding on ${input.compId} is waived — ${input.competitionName}`,
      ...renderMail({
        greeting: `Hello ${input.entrantName},`,
        paragraphs: [
          `the contest director ${input.grantedBy} waived one finding on your entry ${input.compId} at ${input.competitionName}, ${scope}. It does not hold your glider while the waiver stands.`,
          `The director’s reason: ${input.grantReason}`,
          'The waived check:',
        ],
        list: [{ text: what, link: ruleLink(input.base, input.competitionId, input.checkId) }],
        closing: [
          input.scope === 'day'
            ? 'The finding counts again on the next day unless it is put right: fix it when you can.'
            : 'The director may withdraw a waiver; you will get an e-mail if they do. Fix the finding when you can.',
        ],
        action: { label: 'See the waiver on your entry', url: input.entryUrl },
      }),
    }
  }
  return {
    subject: `A waiver on ${input.compId} is withdrawn — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `the contest director${input.withdrawnBy ? ` ${input.withdrawnBy}` : ''} withdrew the waiver granted ${scope} on your entry ${input.compId} at ${input.competitionName}. The finding counts again from now.`,
        `The reason for withdrawing it: ${input.withdrawalReason ?? ''}`,
        `It had been granted by ${input.grantedBy}: ${input.grantReason}`,
        'The check that counts again:',
      ],
      list: [{ text: what, link: ruleLink(input.base, input.competitionId, input.checkId) }],
      closing: [
        input.heldAgain
          ? 'Your glider is held on today’s board until the finding is put right or the director decides otherwise. Put it right, then talk to the scrutineers.'
          : 'Put the finding right before your glider is checked on the grid.',
      ],
      action: { label: 'Open your entry', url: input.entryUrl },
    }),
  }
}

// ---------------------------------------------------------------------------------------
// The entry's way through the office: each message names what happened, lists only what is
// actually still open, and links to the page where its reader acts (the entrant's entry page;
// for the organiser, the same page, where the entry is accepted or rejected).

/** What an entrant is told is still open: lines of an e-mail, each finding with its rule. */
export type OpenItems = (string | MailListItem)[]

export function entrySubmittedMail(input: {
  entrantName: string
  entryLabel: string
  compId: string
  competitionName: string
  /** What the dossier still asks for (nothing that stops submitting). */
  missing: string[]
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `Entry ${input.compId} submitted — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `your entry ${input.entryLabel} in ${input.competitionName} is submitted. The organiser will review it and you will get an e-mail when it is accepted or needs changes.`,
        input.missing.length
          ? 'Meanwhile, the dossier still asks for:'
          : 'The dossier has everything it asks for at the moment; nothing more is needed from you for now.',
      ],
      list: input.missing,
      action: { label: 'Open your entry', url: input.entryUrl },
    }),
  }
}

export function entryToReviewMail(input: {
  pilotName: string
  entryLabel: string
  compId: string
  competitionName: string
  /** The entry's page, where the organiser accepts or rejects it. */
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `New entry to review: ${input.compId} — ${input.competitionName}`,
    ...renderMail({
      paragraphs: [
        `${input.pilotName} submitted the entry ${input.entryLabel} in ${input.competitionName}.`,
        'Open its dossier to accept it, or reject it with a reason the entrant can act on.',
      ],
      action: { label: 'Review the entry', url: input.entryUrl },
    }),
  }
}

export function entryAcceptedMail(input: {
  entrantName: string
  entryLabel: string
  compId: string
  competitionName: string
  /** What is still open on the entry (reminderOpenItems), each finding with its rule. */
  openItems: OpenItems
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `Entry ${input.compId} accepted — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `the organiser accepted your entry ${input.entryLabel} in ${input.competitionName}.`,
        input.openItems.length
          ? 'Before the event, put right what is still open on your entry:'
          : 'Nothing is open on your entry at the moment. Check it once more before you travel.',
      ],
      list: input.openItems,
      action: { label: 'Open your entry', url: input.entryUrl },
    }),
  }
}

export function entryRejectedMail(input: {
  entrantName: string
  entryLabel: string
  compId: string
  competitionName: string
  reason: string
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `Entry ${input.compId} needs changes — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `the organiser did not accept your entry ${input.entryLabel} in ${input.competitionName}. Their reason:`,
        input.reason,
        'Put it right on your entry and submit it again.',
      ],
      action: { label: 'Change and resubmit your entry', url: input.entryUrl },
    }),
  }
}

export function paymentReceivedMail(input: {
  entrantName: string
  compId: string
  competitionName: string
  /** The amount as written, e.g. "€150.00". */
  money: string
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `Payment received: ${input.compId} at ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `we have received your card payment of ${input.money} for the entry fee of ${input.compId} at ${input.competitionName}. Thank you.`,
        'Your entry shows the payment; anything else still open is listed there.',
      ],
      action: { label: 'Open your entry', url: input.entryUrl },
      footer: 'Gridmark, for the competition office. This message was sent automatically; replies are not read.',
    }),
  }
}

// ——— Payments any way: recorded payments, waivers and refunds of any part ———————————————

/** How a payment was made, in a sentence: "by bank transfer". */
const PAID_BY_WORDS: Record<PaymentMethod, string> = {
  'card': 'by card',
  'bank-transfer': 'by bank transfer',
  'cash': 'in cash',
  'other': 'another way',
  'waived': 'as a waiver',
}

/** A payment the office recorded (bank transfer, cash, another way) or a waiver of the fee. */
export function paymentRecordedMail(input: {
  entrantName: string
  compId: string
  competitionName: string
  money: string
  method: RecordedPaymentMethod
  /** The day it was paid, as written ("3 March 2027"). */
  day: string
  reference: string | null
  reason: string | null
  /** What is still owed, as written, or null when the fee is now paid. */
  owed: string | null
  entryUrl: string
}): RenderedMail & { subject: string } {
  const waived = input.method === 'waived'
  const what = `the entry fee of ${input.compId} at ${input.competitionName}`
  return {
    subject: `${waived ? 'Entry fee waived' : 'Payment recorded'}: ${input.compId} at ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        waived
          ? `the competition office has waived ${input.money} of ${what}.`
          : `the competition office has recorded your payment of ${input.money} ${PAID_BY_WORDS[input.method]} on ${input.day}${input.reference ? ` (reference ${input.reference})` : ''} for ${what}. Thank you.`,
        ...(input.reason ? [`${waived ? 'Reason' : 'Note'}: ${input.reason}`] : []),
        input.owed ? `${input.owed} of the entry fee is still to pay.` : 'Your entry fee is now paid.',
      ],
      action: { label: 'Open your entry', url: input.entryUrl },
      footer: 'Gridmark, for the competition office. This message was sent automatically; replies are not read.',
    }),
  }
}

/** A refund of (part of) one payment: through the payment service for a card, recorded otherwise. */
export function refundMail(input: {
  entrantName: string
  compId: string
  competitionName: string
  money: string
  method: PaymentMethod
  /** The office's reason; null for a refund made at the payment service itself. */
  reason: string | null
  /** Nothing of the money paid remains. */
  full: boolean
  /** What is owed now, as written, where the entry is still in the competition; else null. */
  owed: string | null
  entryUrl: string
}): RenderedMail & { subject: string } {
  const what = `the entry fee for ${input.compId} at ${input.competitionName}`
  const first = input.method === 'card'
    ? `the competition office has refunded ${input.money} of ${what} to the card you paid with. It may take a few days to show on your statement.`
    : input.method === 'waived'
      ? `the competition office has withdrawn ${input.money} of the waiver of ${what}.`
      : `the competition office has refunded ${input.money} of ${what}, which you paid ${PAID_BY_WORDS[input.method]}. Ask the office if it has not reached you within a few days.`
  return {
    subject: `${input.method === 'waived' ? 'Waiver withdrawn' : 'Refund'}: ${input.compId} at ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        first,
        ...(input.reason ? [`Reason: ${input.reason}`] : []),
        input.full
          ? 'Nothing of the fee remains paid. Your entry shows the refund.'
          : 'The rest of the fee stays paid. Your entry shows the refund and what remains paid.',
        ...(input.owed ? [`${input.owed} of the entry fee is now to pay.`] : []),
      ],
      action: { label: 'Open your entry', url: input.entryUrl },
      footer: 'Gridmark, for the competition office. This message was sent automatically; replies are not read.',
    }),
  }
}

export function documentRejectedMail(input: {
  entrantName: string
  compId: string
  competitionName: string
  /** The document's kind as written, e.g. "Insurance certificate". */
  kindLabel: string
  filename: string
  reason: string
  entryUrl: string
}): RenderedMail & { subject: string } {
  return {
    subject: `${input.kindLabel} not accepted — ${input.competitionName}`,
    ...renderMail({
      greeting: `Hello ${input.entrantName},`,
      paragraphs: [
        `A scrutineer of ${input.competitionName} could not accept the ${input.kindLabel.toLowerCase()} you uploaded for entry ${input.compId} (${input.filename}).`,
        `Reason: ${input.reason}`,
        'Upload a corrected document on your entry; it replaces the rejected one and goes back to the review queue.',
      ],
      action: { label: 'Upload a corrected document', url: input.entryUrl },
    }),
  }
}
