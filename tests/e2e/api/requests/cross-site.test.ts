/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Writes come from the app's own pages only: a browser naming another site (Origin, else
// Sec-Fetch-Site) is refused with 403 and nothing is written, and so is a body a plain HTML
// form could send; scripts naming no page, and the signed payment webhook, pass. Pages and API
// answers carry the security headers; HSTS only over https; uploaded files are sandboxed,
// PDFs and images inline, anything else a download. The board's socket refuses another site.
import { io } from 'socket.io-client'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, signedUpClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { getBytes, igcFixture, postForm, tinyPdf, tinyPng } from '../../../support/files'
import { gridEntry, gridWorld, type GridWorld } from '../../../support/grid'

const baseUrl = inject('baseUrl')
let w: GridWorld
let entryId: string

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Cross Site Cup')
  entryId = await gridEntry(w)
}, 60_000)
afterAll(closeTestDb)

const messages = () => `${w.base}/entries/${entryId}/messages`
const messageCount = async () => Number((await testDb()('entry_messages').where({ entry_id: entryId }).count<{ count: string }[]>('id as count'))[0]!.count)

/** A request as a browser would send it: the client's cookie and address, and the headers given. */
async function send(client: ApiClient, method: string, path: string, headers: Record<string, string>, body?: string) {
  const res = await fetch(baseUrl + path, {
    method,
    headers: { 'x-forwarded-for': client.address, 'accept': 'application/json', ...(client.cookie ? { cookie: client.cookie } : {}), ...headers },
    body,
    redirect: 'manual',
  })
  const text = await res.text()
  let parsed: any = text
  try { parsed = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, headers: res.headers, body: parsed }
}

const json = { 'content-type': 'application/json' }
const hello = JSON.stringify({ body: 'Is the trailer parking by the hangar?' })

describe('writes from another site', () => {
  it('refuses a form-encoded POST (a plain HTML form) with 403, on a signed-in write and on sign-in; nothing is written', async () => {
    const before = await messageCount()
    const form = await send(w.entrant.client, 'POST', messages(), { 'content-type': 'application/x-www-form-urlencoded' }, 'body=Hello+office')
    expect(form.status).toBe(403)
    expect(form.body.message).toMatch(/not by a plain web form/)
    const plain = await send(w.entrant.client, 'POST', messages(), { 'content-type': 'text/plain' }, '{"body":"Hello office"}')
    expect(plain.status).toBe(403)
    const signIn = await send(new ApiClient(baseUrl), 'POST', '/api/auth/login', { 'content-type': 'application/x-www-form-urlencoded' }, `email=${encodeURIComponent(w.entrant.email)}&password=${encodeURIComponent(GOOD_PASSWORD)}`)
    expect(signIn.status).toBe(403)
    expect(signIn.headers.getSetCookie()).toEqual([])
    // A body with no type at all is not JSON either.
    expect((await send(w.entrant.client, 'POST', messages(), {}, 'body=Hello')).status).toBe(403)
    // Any other type a form cannot send is not JSON either: 415, with what to send instead.
    const xml = await send(w.entrant.client, 'POST', messages(), { 'content-type': 'application/xml' }, '<body>Hello</body>')
    expect(xml.status).toBe(415)
    expect(xml.body.message).toMatch(/Send JSON/)
    expect(await messageCount()).toBe(before)
  })

  it('refuses a JSON POST whose Origin is another site, or "null", with 403 and a message; nothing is written', async () => {
    const before = await messageCount()
    for (const origin of ['https://gliding-forum.example', 'null', `${baseUrl}.example`, baseUrl.replace('http:', 'https:')]) {
      const res = await send(w.entrant.client, 'POST', messages(), { ...json, origin }, hello)
      expect(res.status, origin).toBe(403)
      expect(res.body.message).toMatch(/sent from another website/)
    }
    // PATCH and DELETE alike; sign-up too, which needs no account.
    expect((await send(w.entrant.client, 'PATCH', `${w.base}/entries/${entryId}`, { ...json, origin: 'https://gliding-forum.example' }, JSON.stringify({ emergencyContact: 'Pat' }))).status).toBe(403)
    expect((await send(w.entrant.client, 'DELETE', '/api/_auth/session', { origin: 'https://gliding-forum.example' })).status).toBe(403)
    const email = uniqueEmail('cross')
    expect((await send(new ApiClient(baseUrl), 'POST', '/api/auth/signup', { ...json, origin: 'https://gliding-forum.example' }, JSON.stringify({ email, name: 'Cross Site', password: GOOD_PASSWORD }))).status).toBe(403)
    expect(await testDb()('users').where({ email }).first()).toBeUndefined()
    expect(await messageCount()).toBe(before)
    // The session was not ended by the refused sign-out.
    expect((await w.entrant.client.get('/api/me')).status).toBe(200)
  })

  it('refuses a write whose Sec-Fetch-Site is cross-site or same-site when the browser sends no Origin', async () => {
    const before = await messageCount()
    for (const site of ['cross-site', 'same-site']) {
      const res = await send(w.entrant.client, 'POST', messages(), { ...json, 'sec-fetch-site': site }, hello)
      expect(res.status, site).toBe(403)
      expect(res.body.message).toMatch(/sent from another website/)
    }
    // A body-less write (sign-out) from another site is refused too.
    expect((await send(w.entrant.client, 'POST', '/api/auth/logout', { 'sec-fetch-site': 'cross-site' })).status).toBe(403)
    expect(await messageCount()).toBe(before)
    expect((await w.entrant.client.get('/api/me')).status).toBe(200)
  })

  it('accepts the app’s own pages (same origin), a typed address (none), and a script that names no page', async () => {
    const before = await messageCount()
    const own = await send(w.entrant.client, 'POST', messages(), { ...json, 'origin': baseUrl, 'sec-fetch-site': 'same-origin' }, hello)
    expect(own.status, JSON.stringify(own.body)).toBe(201)
    expect((await send(w.entrant.client, 'POST', messages(), { ...json, 'sec-fetch-site': 'same-origin' }, hello)).status).toBe(201)
    expect((await send(w.entrant.client, 'POST', messages(), { ...json, 'sec-fetch-site': 'none' }, hello)).status).toBe(201)
    expect((await send(w.entrant.client, 'POST', messages(), json, hello)).status).toBe(201)
    expect(await messageCount()).toBe(before + 4)
    // Reading is never refused: a GET from another site's page is answered as ever.
    expect((await send(w.entrant.client, 'GET', messages(), { 'origin': 'https://gliding-forum.example', 'sec-fetch-site': 'cross-site' })).status).toBe(200)
  })

  it('accepts a multipart upload and a body-less sign-out from the app’s own page', async () => {
    const upload = await postForm(w.entrant.client, `${w.base}/entries/${entryId}/documents`, { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'insurance.png', data: tinyPng() })
    expect(upload.status).toBe(201)
    const { client: someone } = await signedUpClient(baseUrl, 'Lee Leaver')
    const out = await send(someone, 'POST', '/api/auth/logout', { 'origin': baseUrl, 'sec-fetch-site': 'same-origin' })
    expect(out.status).toBeLessThan(300)
    expect((await someone.get('/api/me')).status).toBe(401)
  })

  it('behind a trusted proxy, takes the page’s origin from the forwarded scheme and host', async () => {
    const proxied = { ...json, 'x-forwarded-proto': 'https', 'x-forwarded-host': 'scrutineering.example' }
    const own = await send(w.entrant.client, 'POST', messages(), { ...proxied, origin: 'https://scrutineering.example' }, hello)
    expect(own.status, JSON.stringify(own.body)).toBe(201)
    // The same host over plain http is another origin than the https page.
    expect((await send(w.entrant.client, 'POST', messages(), { ...proxied, origin: 'http://scrutineering.example' }, hello)).status).toBe(403)
  })
})

describe('the payment webhook', () => {
  it('is not refused for coming from elsewhere: its signature decides', async () => {
    const res = await send(new ApiClient(baseUrl), 'POST', '/api/payments/webhook', { ...json, 'origin': 'https://payments.example', 'sec-fetch-site': 'cross-site' }, JSON.stringify({ type: 'checkout.session.completed' }))
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/signature/)
  })
})

describe('security headers', () => {
  it('a page: a CSP with a fresh nonce for its scripts, no framing, a Referrer-Policy, nosniff, no HSTS over http', async () => {
    const res = await fetch(`${baseUrl}/sign-in`)
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('frame-ancestors \'none\'')
    expect(csp).toContain('object-src \'none\'')
    expect(csp).toContain('base-uri \'none\'')
    expect(csp).not.toContain('upgrade-insecure-requests')
    const nonce = /script-src [^;]*'nonce-([^']+)'/.exec(csp)?.[1]
    expect(nonce).toBeTruthy()
    const html = await res.text()
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map(m => m[0])
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    expect(res.headers.get('referrer-policy')).toBe('same-origin')
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('x-frame-options')).toBe('DENY')
    expect(res.headers.get('permissions-policy')).toMatch(/camera=\(self\)/)
    expect(res.headers.get('strict-transport-security')).toBeNull()
    // Each page gets its own nonce.
    const again = await fetch(`${baseUrl}/sign-in`)
    expect(again.headers.get('content-security-policy')).not.toContain(`'nonce-${nonce}'`)
  })

  it('an API answer: a CSP that runs nothing and allows no frame, a Referrer-Policy, nosniff', async () => {
    const res = await fetch(`${baseUrl}/api/health`)
    expect(res.headers.get('content-security-policy')).toBe('default-src \'none\'; frame-ancestors \'none\'')
    expect(res.headers.get('referrer-policy')).toBe('same-origin')
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('strict-transport-security')).toBeNull()
    // A refusal carries them too.
    const refused = await send(new ApiClient(baseUrl), 'POST', '/api/auth/login', { 'content-type': 'text/plain' }, 'x')
    expect(refused.headers.get('x-content-type-options')).toBe('nosniff')
  })

  it('HSTS only when the request came over https through a trusted proxy, never believed from a client alone', async () => {
    const secure = await fetch(`${baseUrl}/sign-in`, { headers: { 'x-forwarded-proto': 'https' } })
    expect(secure.headers.get('strict-transport-security')).toBe('max-age=15552000; includeSubDomains')
    const api = await fetch(`${baseUrl}/api/health`, { headers: { 'x-forwarded-proto': 'https' } })
    expect(api.headers.get('strict-transport-security')).toBe('max-age=15552000; includeSubDomains')
    expect((await fetch(`${baseUrl}/sign-in`, { headers: { 'x-forwarded-proto': 'http' } })).headers.get('strict-transport-security')).toBeNull()
  })
})

describe('uploaded files served back', () => {
  it('a PDF and an image inline, sandboxed, nosniff, framed by the app’s own pages only', async () => {
    const pdf = await postForm(w.entrant.client, `${w.base}/entries/${entryId}/documents`, { kind: 'airworthiness', expiresOn: '2027-09-30' }, { name: 'arc.pdf', data: tinyPdf('Airworthiness'), type: 'application/pdf' })
    const png = await postForm(w.entrant.client, `${w.base}/entries/${entryId}/documents`, { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'cover.png', data: tinyPng() })
    for (const [doc, type, name] of [[pdf, 'application/pdf', 'arc.pdf'], [png, 'image/png', 'cover.png']] as const) {
      expect(doc.status).toBe(201)
      const res = await getBytes(w.entrant.client, `${w.base}/entries/${entryId}/documents/${doc.body.document.id}/file`)
      expect(res.status).toBe(200)
      expect(res.headers.get('content-type')).toBe(type)
      expect(res.headers.get('content-disposition')).toMatch(new RegExp(`^inline; filename="${name}"`))
      expect(res.headers.get('content-security-policy')).toMatch(/^sandbox;/)
      expect(res.headers.get('content-security-policy')).toContain('frame-ancestors \'self\'')
      expect(res.headers.get('x-content-type-options')).toBe('nosniff')
      expect(res.headers.get('x-frame-options')).toBe('SAMEORIGIN')
    }
  })

  it('an IGC file as a sandboxed download', async () => {
    const recorder = await testDb()('units').where({ entry_id: entryId, kind: 'flight-recorder' }).first('id')
    const up = await postForm(w.entrant.client, `${w.base}/entries/${entryId}/igc-files`, { unitId: recorder.id }, { name: 'flight.igc', data: igcFixture('valid-declaration.igc') })
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    const res = await getBytes(w.entrant.client, `${w.base}/entries/${entryId}/igc-files/${up.body.igcFile.id}/file`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="flight.igc"/)
    expect(res.headers.get('content-security-policy')).toMatch(/^sandbox;/)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
  })
})

describe('the board’s socket', () => {
  /** The handshake's outcome over a websocket from a page of `origin`: 'connected' or the refusal. */
  function handshake(origin: string): Promise<string> {
    const socket = io(baseUrl, {
      path: '/socket.io/',
      transports: ['websocket'],
      extraHeaders: { 'cookie': w.director.client.cookie, 'x-forwarded-for': w.director.client.address, origin },
      reconnection: false,
      timeout: 5000,
    })
    return new Promise((resolve) => {
      socket.once('connect', () => { socket.close(); resolve('connected') })
      socket.once('connect_error', (err) => { socket.close(); resolve(err.message) })
    })
  }

  it('refuses a handshake from another site’s page, over websocket and polling; the app’s own page connects', async () => {
    expect(await handshake('https://gliding-forum.example')).toMatch(/only connects from Gridmark’s own pages/)
    expect(await handshake(baseUrl)).toBe('connected')
    const polling = await fetch(`${baseUrl}/socket.io/?EIO=4&transport=polling`, { headers: { cookie: w.director.client.cookie, origin: 'https://gliding-forum.example' } })
    expect(polling.status).toBe(403)
    const own = await fetch(`${baseUrl}/socket.io/?EIO=4&transport=polling`, { headers: { cookie: w.director.client.cookie, origin: baseUrl } })
    expect(own.status).toBe(200)
  })
})
