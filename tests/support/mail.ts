// Helpers for tests of e-mail: read the local SMTP capture that `npm test` started (through
// its JSON API), and switch its simulated outage. Every test filters by a recipient address
// of its own — the capture is shared by the whole run, so nothing here clears all messages.
import { inject } from 'vitest'
import type { CapturedMessage } from '../../scripts/lib/fake-smtp'

export type { CapturedMessage }

function captureUrl(): string {
  const url = inject('serviceEnv').MAIL_CAPTURE_URL
  if (!url) throw new Error('MAIL_CAPTURE_URL is not set: run the tests through `npm test`, which starts the mail capture.')
  return url
}

export async function capturedMail(to: string): Promise<CapturedMessage[]> {
  const res = await fetch(`${captureUrl()}/api/messages?to=${encodeURIComponent(to)}`)
  if (!res.ok) throw new Error(`mail capture answered ${res.status}`)
  return await res.json() as CapturedMessage[]
}

/** Forgets the captured messages to one address (e.g. a test account's confirmation link, once used). */
export async function clearMail(to: string): Promise<void> {
  const res = await fetch(`${captureUrl()}/api/messages?to=${encodeURIComponent(to)}`, { method: 'DELETE' })
  if (!res.ok) throw new Error(`mail capture answered ${res.status}`)
}

/** Waits until at least `count` messages reached `to`; returns them, newest first. */
export async function waitForMail(to: string, options: { count?: number, timeoutMs?: number } = {}): Promise<CapturedMessage[]> {
  const count = options.count ?? 1
  const deadline = Date.now() + (options.timeoutMs ?? 15_000)
  for (;;) {
    const messages = await capturedMail(to)
    if (messages.length >= count) return messages
    if (Date.now() > deadline) throw new Error(`expected ${count} message(s) to ${to}, got ${messages.length}`)
    await new Promise(r => setTimeout(r, 150))
  }
}

/** Simulates an SMTP outage, for the given recipients only (so other tests' mail still flows). */
export async function setOutage(down: boolean, recipients?: string[]): Promise<void> {
  const res = await fetch(`${captureUrl()}/api/outage`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ down, recipients }),
  })
  if (!res.ok) throw new Error(`mail capture outage switch answered ${res.status}`)
}

/** The invitation link of a captured message. */
export function invitationLink(message: CapturedMessage): string {
  const link = message.links.find(l => /\/invitations\/[\w-]+\.[\w-]+$/.test(l))
  if (!link) throw new Error(`no invitation link in: ${message.text}`)
  return link
}

export function tokenOf(link: string): string {
  return link.split('/invitations/')[1]!
}
