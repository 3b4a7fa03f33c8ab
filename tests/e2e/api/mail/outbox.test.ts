// The outbox: mail written in a transaction is sent by the worker to the local SMTP capture,
// and a message queued while SMTP refuses is retried with backoff until it goes through.
import { afterAll, describe, expect, inject, it } from 'vitest'
import { uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { capturedMail, setOutage, waitForMail } from '../../../support/mail'

afterAll(async () => {
  await setOutage(false)
  await closeTestDb()
})

async function enqueue(to: string, subject: string) {
  const [row] = await testDb()('mail_outbox')
    .insert({ to_address: to, subject, text_body: `Body of ${subject}\nhttp://127.0.0.1/x`, template: 'test' })
    .returning('*')
  return row as { id: string }
}

async function outboxRow(id: string) {
  return await testDb()('mail_outbox').where({ id }).first()
}

async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const value = await read()
    if (ok(value)) return value
    if (Date.now() > deadline) throw new Error(`condition not met in time; last value: ${JSON.stringify(value)}`)
    await new Promise(r => setTimeout(r, 150))
  }
}

describe('mail outbox worker', () => {
  it('sends a queued message and marks it sent', async () => {
    const to = uniqueEmail('outbox')
    const row = await enqueue(to, 'Queued and sent')
    const [mail] = await waitForMail(to)
    expect(mail).toMatchObject({ to: [to], subject: 'Queued and sent' })
    expect(mail!.from).toContain('Gridmark')
    expect(mail!.links).toEqual(['http://127.0.0.1/x'])
    const sent = await until(() => outboxRow(row.id), r => r.sent_at !== null)
    expect(sent).toMatchObject({ attempts: 1, last_error: null })
  })

  it('retries with growing delays while SMTP is down, and delivers once it is back', async () => {
    const to = uniqueEmail('outage')
    await setOutage(true, [to])
    const row = await enqueue(to, 'Sent after the outage')

    const failing = await until(() => outboxRow(row.id), r => r.attempts >= 2)
    expect(failing.sent_at).toBeNull()
    expect(failing.last_error).toMatch(/451|temporar/i)
    // The next attempt is scheduled in the future, further out after each failure.
    expect(new Date(failing.next_attempt_at).getTime()).toBeGreaterThan(Date.now() - 500)
    expect(await capturedMail(to)).toEqual([])

    // Other mail keeps flowing meanwhile.
    const bystander = uniqueEmail('bystander')
    await enqueue(bystander, 'Not affected')
    await waitForMail(bystander)

    await setOutage(false)
    const [mail] = await waitForMail(to, { timeoutMs: 20_000 })
    expect(mail!.subject).toBe('Sent after the outage')
    const sent = await until(() => outboxRow(row.id), r => r.sent_at !== null)
    expect(sent.attempts).toBeGreaterThanOrEqual(3)
    expect(sent.last_error).toBeNull()
    // Exactly one copy arrived.
    expect(await capturedMail(to)).toHaveLength(1)
  })

  it('the capture page lists messages newest first with clickable links; the outage switch checks its body', async () => {
    const capture = inject('serviceEnv').MAIL_CAPTURE_URL!
    const to = uniqueEmail('page')
    await enqueue(to, 'Shown on the page <b>escaped</b>')
    await waitForMail(to)
    const html = await (await fetch(capture)).text()
    expect(html).toContain('Shown on the page &lt;b&gt;escaped&lt;/b&gt;')
    expect(html).toContain('<a href="http://127.0.0.1/x">http://127.0.0.1/x</a>')
    const res = await fetch(`${capture}/api/outage`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"down":"yes"}',
    })
    expect(res.status).toBe(400)
  })
})
