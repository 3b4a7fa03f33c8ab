/* eslint-disable @typescript-eslint/no-explicit-any -- fake responses are what the tests assert */
// Arranging card payment tests: a competition of its own with an entrant, an organiser and
// a scrutineer, an entry to pay for, and the local payment fake's test hooks.
import { createHmac } from 'node:crypto'
import { type ApiClient, signedUpClient } from './api'
import { createClass, createCompetition, createEntry, testDb } from './db'

export interface PaymentScene {
  competitionId: string
  classId: string
  entryId: string
  entrant: ApiClient
  entrantUser: { id: string, email: string, name: string }
  organiser: ApiClient
  organiserEmail: string
  scrutineer: ApiClient
  /** Another entrant of the same competition. */
  otherEntrant: ApiClient
}

export async function paymentScene(baseUrl: string, opts: { feeMinor?: number, status?: string } = {}): Promise<PaymentScene> {
  const e = await signedUpClient(baseUrl, 'Paying Pilot')
  const o = await signedUpClient(baseUrl, 'Office Organiser')
  const s = await signedUpClient(baseUrl, 'Desk Scrutineer')
  const x = await signedUpClient(baseUrl, 'Other Pilot')
  const competitionId = await createCompetition('Fee Trophy', [
    { userId: e.user.id, role: 'entrant' },
    { userId: o.user.id, role: 'organiser' },
    { userId: s.user.id, role: 'scrutineer' },
    { userId: x.user.id, role: 'entrant' },
  ])
  const classId = await createClass(competitionId, 'Standard', opts.feeMinor ?? 30000)
  const entryId = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: opts.status ?? 'submitted' })
  return { competitionId, classId, entryId, entrant: e.client, entrantUser: e.user, organiser: o.client, organiserEmail: o.email, scrutineer: s.client, otherEntrant: x.client }
}

export function fakeUrl(serviceEnv: Record<string, string>): string {
  const url = serviceEnv.GRIDMARK_PAYMENTS_FAKE_URL
  if (!url) throw new Error('The payment fake is not running (GRIDMARK_PAYMENTS_FAKE_URL missing).')
  return url
}

export async function fakePost(serviceEnv: Record<string, string>, path: string, body: unknown = {}): Promise<{ status: number, body: any }> {
  const res = await fetch(fakeUrl(serviceEnv) + path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) })
  return { status: res.status, body: await res.json() }
}

/** Pays a checkout on the fake as its Pay button would; resolves after the webhook was answered. */
export async function payOnFake(serviceEnv: Record<string, string>, checkoutUrl: string, cardNumber?: string) {
  const sessionId = new URL(checkoutUrl).pathname.split('/').pop()!
  return fakePost(serviceEnv, `/__test/sessions/${sessionId}/pay`, cardNumber ? { cardNumber } : {})
}

export async function fakeEvents(serviceEnv: Record<string, string>): Promise<any[]> {
  const res = await fetch(`${fakeUrl(serviceEnv)}/__test/events`)
  return ((await res.json()) as { events: any[] }).events
}

/** A Stripe-Signature header value over payload, as the service signs it. */
export function signature(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  return `t=${timestamp},v1=${createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex')}`
}

export async function postWebhook(baseUrl: string, payload: string, header?: string) {
  const headers: Record<string, string> = { 'content-type': 'application/json' }
  if (header) headers['stripe-signature'] = header
  const res = await fetch(`${baseUrl}/api/payments/webhook`, { method: 'POST', headers, body: payload })
  return { status: res.status, body: await res.json() as any }
}

export async function waitFor<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 5000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  let value = await read()
  while (!ok(value) && Date.now() < deadline) {
    await new Promise(r => setTimeout(r, 100))
    value = await read()
  }
  return value
}

export async function entryRow(entryId: string) {
  return testDb()('entries').where({ id: entryId }).first()
}

export async function paymentRows(entryId: string) {
  return testDb()('payments').where({ entry_id: entryId }).orderBy('created_at')
}

export async function mailFor(entryId: string) {
  return testDb()('mail_outbox').where({ entry_id: entryId }).orderBy('created_at')
}

export async function auditFor(entryId: string, action: string) {
  return testDb()('audit_log').where({ subject_id: entryId, action })
}
