/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert; typing each would restate the assertions */
// A small HTTP client for e2e tests: remembers its session cookie like a browser would and
// speaks from an address of its own (X-Forwarded-For, which the test server trusts).
import { randomBytes, randomUUID } from 'node:crypto'
import { clearMail, waitForMail, type CapturedMessage } from './mail'
import { testDb } from './db'

export interface ApiResponse<T = any> {
  status: number
  headers: Headers
  body: T
}

export class ApiClient {
  cookie = ''
  constructor(readonly baseUrl: string, readonly address = randomAddress()) {}

  async request<T = any>(method: string, path: string, body?: unknown, raw?: string): Promise<ApiResponse<T>> {
    const headers: Record<string, string> = { 'x-forwarded-for': this.address, 'accept': 'application/json' }
    if (this.cookie) headers.cookie = this.cookie
    if (body !== undefined || raw !== undefined) headers['content-type'] = 'application/json'
    const res = await fetch(this.baseUrl + path, {
      method,
      headers,
      body: raw ?? (body === undefined ? undefined : JSON.stringify(body)),
      redirect: 'manual',
    })
    const setCookie = res.headers.getSetCookie().find(c => c.startsWith('gridmark-session='))
    if (setCookie) this.cookie = setCookie.split(';')[0]!
    const text = await res.text()
    let parsed: unknown = text
    try { parsed = JSON.parse(text) }
    catch { /* not JSON */ }
    return { status: res.status, headers: res.headers, body: parsed as T }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  postRaw<T = any>(path: string, raw: string) { return this.request<T>('POST', path, undefined, raw) }
}

export function randomAddress(): string {
  const b = randomBytes(3)
  return `10.${b[0]}.${b[1]}.${b[2]}`
}

export function uniqueEmail(tag = 'user'): string {
  return `${tag}-${randomUUID().slice(0, 8)}@test.gridmark.example`
}

export const GOOD_PASSWORD = 'correct horse battery'

/** The one-time account link (confirmation or password) of a captured message, and its token. */
export function accountLinkOf(message: CapturedMessage, page: '/verify-email' | '/password/reset'): { link: string, token: string } {
  const link = message.links.find(l => l.includes(`${page}?token=`))
  if (!link) throw new Error(`no ${page} link in: ${message.text}`)
  return { link, token: new URL(link).searchParams.get('token')! }
}

/**
 * Signs up a fresh account through the API and signs it in, without confirming its address:
 * sign-up answers 202 and signs nobody in.
 */
export async function signedUpUnverifiedClient(baseUrl: string, name = 'Test Pilot') {
  const client = new ApiClient(baseUrl)
  const email = uniqueEmail()
  const res = await client.post('/api/auth/signup', { email, name, password: GOOD_PASSWORD })
  if (res.status !== 202) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`)
  const signIn = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
  if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status} ${JSON.stringify(signIn.body)}`)
  return { client, email, user: signIn.body.user as { id: string, email: string, name: string } }
}

/**
 * Signs up a fresh account as a person would: sign-up, then the confirmation link from the
 * captured e-mail, which confirms the address and signs in; that e-mail is then cleared from
 * the capture. Returns the signed-in client.
 */
export async function signedUpClient(baseUrl: string, name = 'Test Pilot') {
  const client = new ApiClient(baseUrl)
  const email = uniqueEmail()
  const res = await client.post('/api/auth/signup', { email, name, password: GOOD_PASSWORD })
  if (res.status !== 202) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`)
  const [mail] = await waitForMail(email)
  const confirmed = await client.post('/api/auth/verification/confirm', { token: accountLinkOf(mail!, '/verify-email').token })
  if (confirmed.status !== 200) throw new Error(`confirmation failed: ${confirmed.status} ${JSON.stringify(confirmed.body)}`)
  // The mailbox starts empty for the test, as before addresses were confirmed: tests count
  // what reaches an account, in the capture and in the outbox.
  await clearMail(email)
  await testDb()('mail_outbox').where({ to_address: email, template: 'account-confirm' }).delete()
  return { client, email, user: confirmed.body.user as { id: string, email: string, name: string } }
}
