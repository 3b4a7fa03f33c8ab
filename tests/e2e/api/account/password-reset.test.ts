// Password reset by e-mail against the built server and real PostgreSQL: the same answer whether
// or not the address has an account, a link that works once for one hour, and every session of
// the account ended when the password changes.
import { createHash } from 'node:crypto'
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, accountLinkOf, signedUpClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { waitForMail } from '../../../support/mail'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const NEW_PASSWORD = 'a brand new passphrase'

/** Asks for a reset of `email` and returns the token of the link that reached it. */
async function resetToken(email: string, mailsBefore: number): Promise<string> {
  const res = await new ApiClient(baseUrl).post('/api/auth/password-reset', { email })
  expect(res.status).toBe(202)
  const [mail] = await waitForMail(email, { count: mailsBefore + 1 })
  expect(mail!.subject).toBe('Choose a new Gridmark password')
  return accountLinkOf(mail!, '/password/reset').token
}

describe('asking for a reset', () => {
  it('answers an address with an account and one without identically; only the first gets mail', async () => {
    const { email } = await signedUpClient(baseUrl)
    const nobody = uniqueEmail('nobody')
    const known = await new ApiClient(baseUrl).post('/api/auth/password-reset', { email: email.toUpperCase() })
    const unknown = await new ApiClient(baseUrl).post('/api/auth/password-reset', { email: nobody })
    expect(unknown.status).toBe(known.status)
    expect(unknown.body).toEqual(known.body)
    expect(known).toMatchObject({ status: 202, body: { message: MESSAGES.resetCheckMail } })

    // The outbox row is written in the request's transaction: what it holds now is final.
    expect(await testDb()('mail_outbox').where({ to_address: nobody }).count()).toEqual([{ count: '0' }])
    const [mail] = await waitForMail(email)
    expect(mail!.subject).toBe('Choose a new Gridmark password')
    expect(mail!.text).toContain('one hour')

    // Only the hash of the token is stored.
    const { token } = accountLinkOf(mail!, '/password/reset')
    const user = await testDb()('users').where({ email }).first()
    const rows = await testDb()('account_tokens').where({ user_id: user.id, purpose: 'password-reset' })
    expect(rows).toHaveLength(1)
    expect(rows[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(JSON.stringify(rows)).not.toContain(token)
  })

  it('refuses a body without an address with 400', async () => {
    const res = await new ApiClient(baseUrl).post('/api/auth/password-reset', { email: 'not an address' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.email).toEqual(['Enter an e-mail address like name@example.org.'])
  })
})

describe('choosing the new password', () => {
  it('sets it, refuses the old one, ends every session, confirms the address, and works once', async () => {
    const { client: first, email } = await signedUpClient(baseUrl)
    const second = new ApiClient(baseUrl)
    expect((await second.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await first.get('/api/me')).status).toBe(200)

    const token = await resetToken(email, 0)
    const done = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: NEW_PASSWORD })
    expect(done.status).toBe(200)
    expect(done.body.message).toBe(MESSAGES.resetDone)

    expect((await first.get('/api/me')).status).toBe(401)
    expect((await second.get('/api/me')).status).toBe(401)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(401)
    const fresh = new ApiClient(baseUrl)
    expect((await fresh.post('/api/auth/login', { email, password: NEW_PASSWORD })).status).toBe(200)
    expect((await fresh.get('/api/me')).body.user.emailVerified).toBe(true)

    const again = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'yet another passphrase' })
    expect(again.status).toBe(400)
    expect(again.body.message).toBe(MESSAGES.tokenUsed)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: NEW_PASSWORD })).status).toBe(200)

    const { id } = await testDb()('users').where({ email }).first()
    expect(await testDb()('audit_log').where({ action: 'user.password-reset', subject_id: id })).toHaveLength(1)
  })

  it('marks an unconfirmed address confirmed: the person read the link there', async () => {
    const email = uniqueEmail('unconfirmed')
    expect((await new ApiClient(baseUrl).post('/api/auth/signup', { email, name: 'Una Confirmed', password: GOOD_PASSWORD })).status).toBe(202)
    await waitForMail(email)
    const token = await resetToken(email, 1)
    expect((await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: NEW_PASSWORD })).status).toBe(200)
    expect((await testDb()('users').where({ email }).first()).email_verified_at).not.toBeNull()
  })

  it('refuses an expired link, and an older link once a newer one was sent', async () => {
    const { email } = await signedUpClient(baseUrl)
    const older = await resetToken(email, 0)
    const newer = await resetToken(email, 1)

    const superseded = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token: older, password: NEW_PASSWORD })
    expect(superseded.status).toBe(400)
    expect(superseded.body.message).toBe(MESSAGES.tokenExpired)

    await testDb()('account_tokens').where({ token_hash: createHash('sha256').update(newer).digest('hex') })
      .update({ expires_at: testDb().raw("now() - interval '1 second'") })
    const expired = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token: newer, password: NEW_PASSWORD })
    expect(expired.status).toBe(400)
    expect(expired.body.message).toBe(MESSAGES.tokenExpired)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
  })

  it('refuses an unknown link and a weak password with 400 and a sentence', async () => {
    const unknown = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token: 'x'.repeat(43), password: NEW_PASSWORD })
    expect(unknown.status).toBe(400)
    expect(unknown.body.message).toBe(MESSAGES.tokenInvalid)

    const { email } = await signedUpClient(baseUrl)
    const token = await resetToken(email, 0)
    const weak = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'short' })
    expect(weak.status).toBe(400)
    expect(weak.body.data.fieldErrors.password).toEqual(['Use at least 10 characters.'])
    // A refused password does not spend the link.
    expect((await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: NEW_PASSWORD })).status).toBe(200)
  })
})
