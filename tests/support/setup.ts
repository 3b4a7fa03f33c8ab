// Helpers for the set-up area's tests: a competition with one client per role, raw requests
// (CSV bodies, downloads), and many entries inserted at once.
import { ApiClient, signedUpClient } from './api'
import { createClass, createCompetition, testDb } from './db'

export interface RoleClients {
  competitionId: string
  organiser: ApiClient
  scrutineer: ApiClient
  director: ApiClient
  entrant: ApiClient
  /** Signed in, but holds no role in the competition. */
  outsider: ApiClient
  admin: ApiClient
  anonymous: ApiClient
  ids: Record<'organiser' | 'scrutineer' | 'director' | 'entrant' | 'outsider' | 'admin', string>
}

/** A competition of its own with an organiser, scrutineer, director and entrant, plus an outsider and a site admin. */
export async function competitionWithRoles(baseUrl: string, name: string): Promise<RoleClients> {
  const [o, s, d, e, x, a] = await Promise.all(
    ['Olga Organiser', 'Sami Scrutineer', 'Dana Director', 'Emil Entrant', 'Otto Outsider', 'Ada Admin']
      .map(n => signedUpClient(baseUrl, n)),
  )
  await testDb()('users').where({ id: a!.user.id }).update({ is_admin: true })
  const competitionId = await createCompetition(name, [
    { userId: o!.user.id, role: 'organiser' },
    { userId: s!.user.id, role: 'scrutineer' },
    { userId: d!.user.id, role: 'director' },
    { userId: e!.user.id, role: 'entrant' },
  ])
  return {
    competitionId,
    organiser: o!.client,
    scrutineer: s!.client,
    director: d!.client,
    entrant: e!.client,
    outsider: x!.client,
    admin: a!.client,
    anonymous: new ApiClient(baseUrl),
    ids: { organiser: o!.user.id, scrutineer: s!.user.id, director: d!.user.id, entrant: e!.user.id, outsider: x!.user.id, admin: a!.user.id },
  }
}

/** A request with any body and content type, answering status, headers and text. */
export async function rawRequest(client: ApiClient, method: string, path: string, body?: string | FormData, contentType?: string) {
  const headers: Record<string, string> = { 'x-forwarded-for': client.address, 'accept': 'application/json' }
  if (client.cookie) headers.cookie = client.cookie
  if (contentType) headers['content-type'] = contentType
  const res = await fetch(client.baseUrl + path, { method, headers, body })
  const text = await res.text()
  let json: unknown
  try { json = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, headers: res.headers, text, body: json as any } // eslint-disable-line @typescript-eslint/no-explicit-any -- asserted by the tests
}

export interface GeneratedEntry {
  comp_id: string
  pilot_name: string
  registration: string
  status: string
  payment_status: string
  class_id: string
  submitted_at: Date | null
}

const STATUSES = ['draft', 'submitted', 'accepted', 'rejected', 'withdrawn'] as const
const PAYMENTS = ['unpaid', 'paid', 'refunded'] as const
const FIRST = ['Ana', 'Bram', 'Cleo', 'Dario', 'Edda', 'Finn', 'Greta', 'Hugo', 'Iris', 'Jonas']
const LAST = ['Moorcroft', 'Thermalson', 'Ridgeway', 'Cloudbase', 'Windle', 'Sparrowe', 'Hawksby', 'Lift', 'Vario', 'Glideman']

/**
 * `count` invented entries spread over the given classes, statuses and payment states, in one
 * multi-row insert. Deterministic: entry i has competition ID base-36 of i (e.g. "0", "A", "RS"),
 * so tests can compute what each query must answer.
 */
export async function insertGeneratedEntries(competitionId: string, classIds: string[], entrantUserId: string, count: number): Promise<GeneratedEntry[]> {
  const rows = Array.from({ length: count }, (_, i) => {
    const status = STATUSES[i % STATUSES.length]!
    return {
      competition_id: competitionId,
      class_id: classIds[i % classIds.length]!,
      entrant_user_id: entrantUserId,
      status,
      payment_status: PAYMENTS[Math.floor(i / 5) % PAYMENTS.length]!,
      pilot_name: `${FIRST[i % FIRST.length]} ${LAST[Math.floor(i / 10) % LAST.length]} ${i}`,
      glider_type: 'Test Glider 15',
      registration: `D-${String(1000 + i)}`,
      comp_id: i.toString(36).toUpperCase(),
      submitted_at: status === 'draft' ? null : new Date(Date.UTC(2027, 2, 1) + i * 3_600_000),
    }
  })
  await testDb()('entries').insert(rows)
  return rows
}

export { createClass, testDb }
