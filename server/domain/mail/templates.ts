// The plain layout every e-mail shares (a text part and a simple HTML part saying the same),
// and the templates of the mail area. Other areas build their messages with renderMail().
import { ROLE_LABELS } from '#shared/constants/roles'
import type { InvitableRole } from '#shared/constants/invitations'

export interface MailAction {
  label: string
  url: string
}

export interface MailContent {
  greeting?: string
  paragraphs: string[]
  /** Bulleted lines shown after the paragraphs (e.g. what is still missing). */
  list?: string[]
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
  if (content.list?.length) {
    for (const item of content.list) text.push(`  - ${item}`)
    text.push('')
  }
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
  if (content.list?.length) {
    html.push(`<ul style="${p}padding-left:20px">`, ...content.list.map(item => `<li>${escapeHtml(item)}</li>`), '</ul>')
  }
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
  pilotName: string
  compId: string
  openItems: string[]
  url: string
}): RenderedMail & { subject: string } {
  const day = formatDay(input.firstContestDay) ?? input.firstContestDay
  const paragraphs = [
    `${input.competitionName} starts on ${day}. This is a reminder about your entry ${input.compId} (${input.pilotName}).`,
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
