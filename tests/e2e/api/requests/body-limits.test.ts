// Every body is read with its limit enforced while it streams: a chunked body (no
// Content-Length) is refused with 413 as soon as it passes the limit, before the client has
// finished sending, and so is a declared length above it. JSON 1 MB, the payment webhook 1 MB,
// documents 10 MB.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MESSAGES } from '../../../../shared/constants/messages'
import { ApiClient, randomAddress } from '../../../support/api'
import { sendChunked } from '../../../support/chunked'
import { closeTestDb } from '../../../support/db'
import { entriesWorld, entryBody, createEntryVia, type EntriesWorld } from '../../../support/entries'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

/** Sends `total` bytes chunked after `head`, from a fresh client address. */
const sendChunkedTo = (path: string, headers: Record<string, string>, total: number, head = '', tail = '') =>
  sendChunked(new URL(path, baseUrl).href, { headers: { 'x-forwarded-for': randomAddress(), ...headers }, head, tail, totalBytes: total })

describe('a JSON body', () => {
  it('sent chunked and larger than 1 MB is refused with 413 while it streams, on a route that needs no account', async () => {
    // 30 MB offered: the answer comes long before it is all sent.
    const res = await sendChunkedTo('/api/auth/login', { 'content-type': 'application/json' }, 30 * 1024 * 1024, '{"email":"a@b.org","password":"')
    expect(res.status).toBe(413)
    expect(res.body.message).toBe(MESSAGES.bodyTooLarge)
    expect(res.finished).toBe(false)
  })

  it('declared larger than 1 MB is refused before it is read', async () => {
    const big = JSON.stringify({ email: 'a@b.org', password: 'x'.repeat(1024 * 1024) })
    const res = await new ApiClient(baseUrl).postRaw('/api/auth/login', big)
    expect(res.status).toBe(413)
    expect(res.body.message).toBe(MESSAGES.bodyTooLarge)
  })

  it('just under 1 MB is read and answered by its schema', async () => {
    const res = await new ApiClient(baseUrl).postRaw('/api/auth/login', JSON.stringify({ email: 'a@b.org', password: 'x'.repeat(1000 * 1000) }))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.password).toBeDefined()
  })
})

describe('the payment webhook', () => {
  it('refuses a chunked body larger than 1 MB with 413 while it streams', async () => {
    const res = await sendChunkedTo('/api/payments/webhook', { 'content-type': 'application/json', 'stripe-signature': 't=1,v1=00' }, 30 * 1024 * 1024, '{"id":"evt_x","data":"')
    expect(res.status).toBe(413)
    expect(res.body.message).toBe(MESSAGES.webhookTooLarge)
    expect(res.finished).toBe(false)
  })
})

describe('a document upload', () => {
  let w: EntriesWorld
  let entryId: string
  beforeAll(async () => {
    w = await entriesWorld(baseUrl, 'Body Limit Cup')
    entryId = await createEntryVia(w.entrant.client, w.competitionId, entryBody(w.classId))
  })

  it('sent chunked and larger than 10 MB is refused with 413 while it streams', async () => {
    const boundary = 'gridmark-test-boundary'
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\ninsurance\r\n`
      + `--${boundary}\r\nContent-Disposition: form-data; name="expiresOn"\r\n\r\n2027-12-31\r\n`
      + `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n`
    const res = await sendChunkedTo(`/api/competitions/${w.competitionId}/entries/${entryId}/documents`, {
      'content-type': `multipart/form-data; boundary=${boundary}`,
      'cookie': w.entrant.client.cookie,
      'x-forwarded-for': w.entrant.client.address,
    }, 30 * 1024 * 1024, head, `\r\n--${boundary}--\r\n`)
    expect(res.status).toBe(413)
    expect(res.body.message).toBe(MESSAGES.documentTooLarge)
    expect(res.finished).toBe(false)
  })
})
