/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// A control character (NUL, ESC, …) in any text of a request is refused with 400 naming its
// field, on every route, signed in or not — never a 500 from PostgreSQL. Tabs and line breaks
// are kept. One check in the route kit (server/utils/validation.ts) covers them all.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { entryBody } from '../../../support/entries'
import { postForm, tinyPdf } from '../../../support/files'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'

const baseUrl = inject('baseUrl')
let w: GridWorld
let entryId: string

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Control Character Cup')
  entryId = await gridEntry(w)
}, 60_000)
afterAll(closeTestDb)

/** 400, the field named in fieldErrors and in the message. */
function expectRefused(res: { status: number, body: any }, field: string, path = field) {
  expect(res.status, JSON.stringify(res.body)).toBe(400)
  expect(res.body.data.fieldErrors[field]).toEqual([expect.stringContaining('control character')])
  expect(res.body.message).toContain(`“${path}”`)
}

describe('control characters in a JSON body', () => {
  it('are refused on sign-in and sign-up, which need no account', async () => {
    expectRefused(await new ApiClient(baseUrl).post('/api/auth/login', { email: 'pilot\u0000@example.org', password: 'anything at all' }), 'email')
    expectRefused(await new ApiClient(baseUrl).post('/api/auth/login', { email: uniqueEmail(), password: 'long enough\u0000' }), 'password')
    const email = uniqueEmail('nul')
    expectRefused(await new ApiClient(baseUrl).post('/api/auth/signup', { email, name: 'Nul\u0000 Pilot', password: GOOD_PASSWORD }), 'name')
    expect(await testDb()('users').where({ email }).first()).toBeUndefined()
  })

  it('are refused on the write routes of every role, and nothing is stored', async () => {
    const base = w.base
    const cases: [ApiClient, string, string, Record<string, unknown>, string, string?][] = [
      [w.admin.client, 'POST', '/api/competitions', { name: 'Cup\u0000', airfieldName: 'Field', airfieldIcao: 'EDXX', timeZone: 'Europe/Berlin', firstContestDay: '2027-06-01', lastContestDay: '2027-06-05', organiserEmail: w.organiser.email }, 'name'],
      [w.outsider.client, 'POST', `${base}/entries`, entryBody(w.classId, { pilotName: 'Nora\u001b[31m Red' }), 'pilotName'],
      [w.entrant.client, 'PATCH', `${base}/entries/${entryId}`, { emergencyContact: 'Pat\u0000' }, 'emergencyContact'],
      [w.entrant.client, 'POST', `${base}/entries/${entryId}/messages`, { body: 'Hello office\u0000' }, 'body'],
      [w.scrutineer.client, 'POST', `${base}/grid-checks`, checkBody(entryId, { answers: [{ itemId: 'antennas', result: 'fail', note: 'loose\u0000' }] }), 'answers', 'answers.0.note'],
      [w.director.client, 'POST', `${base}/entries/${entryId}/hold`, { reason: 'Ballast\u0007 not drained' }, 'reason'],
      [w.organiser.client, 'POST', `${base}/invitations`, { email: 'new\u0000@example.org', role: 'scrutineer' }, 'email'],
      [w.organiser.client, 'POST', `${base}/firmware/import`, { csv: 'unit_family,version,expires_on\nCW,7.0\u0000,2028-01-01\n' }, 'csv'],
    ]
    for (const [client, method, path, body, field, fieldPath] of cases) {
      const res = await client.request(method, path, body)
      expectRefused(res, field, fieldPath)
    }
    expect(await testDb()('grid_checks').where({ entry_id: entryId }).count()).toEqual([{ count: '0' }])
    expect(await testDb()('entry_messages').where({ entry_id: entryId }).count()).toEqual([{ count: '0' }])
  })

  it('keeps tabs and line breaks of multi-line text', async () => {
    const res = await w.entrant.client.post(`${w.base}/entries/${entryId}/messages`, { body: 'Two questions:\r\n1.\tBallast\n2.\tTrailer' })
    expect(res.status).toBe(201)
    expect(res.body.message.body).toBe('Two questions:\r\n1.\tBallast\n2.\tTrailer')
  })
})

describe('control characters elsewhere in a request', () => {
  it('are refused in a query, naming the parameter', async () => {
    expectRefused(await w.organiser.client.get(`${w.base}/entries?q=K%00`), 'q')
  })

  it('name nothing in an address: 404', async () => {
    expect((await w.organiser.client.get(`${w.base}/entries/abc%00def`)).status).toBe(404)
  })

  it('are refused in the text fields of an upload', async () => {
    const res = await postForm(w.entrant.client, `${w.base}/entries/${entryId}/documents`, { kind: 'insurance', expiresOn: '2027-12-31\u0000' }, { name: 'cover.pdf', data: tinyPdf(), type: 'application/pdf' })
    expectRefused(res, 'expiresOn')
  })

  it('are refused in a CSV file sent as it is', async () => {
    const res = await fetch(`${baseUrl}${w.base}/firmware/import`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv', 'cookie': w.organiser.client.cookie, 'x-forwarded-for': w.organiser.client.address },
      body: 'unit_family,version,expires_on\r\nCW,7.0\u0000,2028-01-01\r\n',
    })
    expectRefused({ status: res.status, body: await res.json() }, 'csv')
  })
})
