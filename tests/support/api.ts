/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert; typing each would restate the assertions */
// A small HTTP client for e2e tests: remembers its session cookie like a browser would and
// speaks from an address of its own (X-Forwarded-For, which the test server trusts).
import { randomBytes, randomUUID } from 'node:crypto'

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

/** Signs up a fresh account and returns its signed-in client. */
export async function signedUpClient(baseUrl: string, name = 'Test Pilot') {
  const client = new ApiClient(baseUrl)
  const email = uniqueEmail()
  const res = await client.post('/api/auth/signup', { email, name, password: GOOD_PASSWORD })
  if (res.status !== 201) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { client, email, user: res.body.user as { id: string, email: string, name: string } }
}
