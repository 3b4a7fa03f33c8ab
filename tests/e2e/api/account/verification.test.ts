// Confirming the e-mail address at sign-up, and a change of address, against the built server and
// real PostgreSQL: sign-up answers alike for a new and a taken address; an unconfirmed account can
// sign in but not enter a glider or accept an invitation; a new address counts only once its link
// is opened.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, accountLinkOf, signedUpClient, signedUpUnverifiedClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { waitForMail } from '../../../support/mail'
import { entriesWorld, entryBody, type EntriesWorld } from '../../../support/entries'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: EntriesWorld
beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Confirmation Cup')
})

describe('sign-up', () => {
  it('answers a taken address like a new one; the owner is told, nothing is created', async () => {
    const { email: taken, user } = await signedUpClient(baseUrl, 'Tara Taken')
    const fresh = uniqueEmail('fresh')
    const forTaken = await new ApiClient(baseUrl).post('/api/auth/signup', { email: taken, name: 'Someone Else', password: 'another good password' })
    const forFresh = await new ApiClient(baseUrl).post('/api/auth/signup', { email: fresh, name: 'Fern Fresh', password: GOOD_PASSWORD })
    expect(forTaken.status).toBe(forFresh.status)
    expect(forTaken.status).toBe(202)
    expect(forTaken.body).toEqual({ message: MESSAGES.signUpCheckMail(taken) })
    expect(forFresh.body).toEqual({ message: MESSAGES.signUpCheckMail(fresh) })
    expect(forTaken.headers.getSetCookie().some(c => c.startsWith('gridmark-session='))).toBe(false)
    expect(forFresh.headers.getSetCookie().some(c => c.startsWith('gridmark-session='))).toBe(false)

    const [note] = await waitForMail(taken)
    expect(note!.subject).toBe('Someone tried to create a Gridmark account with your address')
    expect(note!.links.some(l => l.endsWith('/password/forgot'))).toBe(true)
    const owner = await testDb()('users').where({ id: user.id }).first()
    expect(owner.name).toBe('Tara Taken')
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email: taken, password: 'another good password' })).status).toBe(401)

    const [confirm] = await waitForMail(fresh)
    expect(confirm!.subject).toBe('Confirm your e-mail address for Gridmark')
  })
})

describe('an unconfirmed account', () => {
  it('signs in, cannot enter a glider, asks for the link again, and enters once confirmed', async () => {
    const { client, email } = await signedUpUnverifiedClient(baseUrl)
    expect((await client.get('/api/me')).body.user.emailVerified).toBe(false)

    const refused = await client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'UV1' }))
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe(MESSAGES.verificationRequired)
    expect(await testDb()('entries').where({ competition_id: w.competitionId, comp_id: 'UV1' }).first()).toBeUndefined()

    const resent = await client.post('/api/auth/verification/resend')
    expect(resent.status).toBe(202)
    expect(resent.body.message).toBe(MESSAGES.verificationSent(email))
    const [newest, first] = await waitForMail(email, { count: 2 })
    // The newer link replaces the first.
    const stale = await client.post('/api/auth/verification/confirm', { token: accountLinkOf(first!, '/verify-email').token })
    expect(stale.status).toBe(400)
    expect(stale.body.message).toBe(MESSAGES.tokenExpired)

    const confirmed = await client.post('/api/auth/verification/confirm', { token: accountLinkOf(newest!, '/verify-email').token })
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.user).toMatchObject({ email, emailVerified: true })
    expect((await client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'UV1' }))).status).toBe(201)

    const again = await client.post('/api/auth/verification/resend')
    expect(again.status).toBe(409)
    expect(again.body.message).toBe(MESSAGES.alreadyVerified)
  })

  it('cannot accept an invitation until the address is confirmed', async () => {
    const { client, email } = await signedUpUnverifiedClient(baseUrl)
    const invited = await w.organiser.client.post(`/api/competitions/${w.competitionId}/invitations`, { email, role: 'scrutineer' })
    expect(invited.status).toBe(201)
    const invitation = (await waitForMail(email, { count: 2 })).find(m => m.subject.startsWith('Invitation'))!
    const token = invitation.links.find(l => l.includes('/invitations/'))!.split('/invitations/')[1]!

    const refused = await client.post(`/api/invitations/${token}/accept`)
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe(MESSAGES.verificationRequired)
    expect(await testDb()('memberships').where({ competition_id: w.competitionId, user_id: (await client.get('/api/me')).body.user.id })).toHaveLength(0)
  })

  it('is asked to wait after five links in an hour', async () => {
    const { client } = await signedUpUnverifiedClient(baseUrl)
    const statuses: number[] = []
    for (let i = 0; i < 5; i++) statuses.push((await client.post('/api/auth/verification/resend')).status)
    // The sign-up's own link counts: four more are sent, the fifth is refused.
    expect(statuses).toEqual([202, 202, 202, 202, 429])
  })

  it('needs to be signed in to ask for the link again', async () => {
    expect((await new ApiClient(baseUrl).post('/api/auth/verification/resend')).status).toBe(401)
  })
})

describe('a confirmation link', () => {
  it('refuses an unknown, a used or an expired link with a sentence', async () => {
    const unknown = await new ApiClient(baseUrl).post('/api/auth/verification/confirm', { token: 'y'.repeat(43) })
    expect(unknown).toMatchObject({ status: 400, body: { message: MESSAGES.tokenInvalid } })
    const malformed = await new ApiClient(baseUrl).post('/api/auth/verification/confirm', { token: 'short' })
    expect(malformed.status).toBe(400)

    const { email } = await signedUpUnverifiedClient(baseUrl)
    const { token } = accountLinkOf((await waitForMail(email))[0]!, '/verify-email')
    await testDb()('account_tokens').where({ token_hash: createHash('sha256').update(token).digest('hex') })
      .update({ expires_at: testDb().raw("now() - interval '1 second'") })
    const expired = await new ApiClient(baseUrl).post('/api/auth/verification/confirm', { token })
    expect(expired).toMatchObject({ status: 400, body: { message: MESSAGES.tokenExpired } })
    expect((await testDb()('users').where({ email }).first()).email_verified_at).toBeNull()
  })
})

describe('changing the e-mail address', () => {
  it('keeps the old address until the link sent to the new one is opened; the old one is told', async () => {
    const { client, email: oldEmail, user } = await signedUpClient(baseUrl)
    const newEmail = uniqueEmail('moved')

    const wrong = await client.post('/api/me/email', { email: newEmail, password: 'not my password' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fieldErrors.password).toEqual([MESSAGES.wrongPassword])

    const asked = await client.post('/api/me/email', { email: newEmail, password: GOOD_PASSWORD })
    expect(asked.status).toBe(202)
    expect(asked.body.message).toBe(MESSAGES.emailChangeCheckMail(newEmail))
    expect((await client.get('/api/me')).body.user).toMatchObject({ email: oldEmail, emailVerified: true })
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email: oldEmail, password: GOOD_PASSWORD })).status).toBe(200)

    const [link] = await waitForMail(newEmail)
    expect(link!.subject).toBe('Confirm your new e-mail address for Gridmark')
    const confirmed = await new ApiClient(baseUrl).post('/api/auth/verification/confirm', { token: accountLinkOf(link!, '/verify-email').token })
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.user).toMatchObject({ id: user.id, email: newEmail, emailVerified: true })

    expect((await client.get('/api/me')).body.user.email).toBe(newEmail)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email: oldEmail, password: GOOD_PASSWORD })).status).toBe(401)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email: newEmail, password: GOOD_PASSWORD })).status).toBe(200)
    const [notice] = await waitForMail(oldEmail)
    expect(notice!.subject).toBe('Your Gridmark account now uses another e-mail address')
    expect(notice!.text).toContain(newEmail)
    expect(await testDb()('audit_log').where({ action: 'user.email-changed', subject_id: user.id })).toHaveLength(1)
  })

  it('answers alike for an address that belongs to another account, and changes nothing', async () => {
    const { client, email } = await signedUpClient(baseUrl)
    const { email: othersEmail } = await signedUpClient(baseUrl)
    const res = await client.post('/api/me/email', { email: othersEmail, password: GOOD_PASSWORD })
    expect(res.status).toBe(202)
    expect(res.body.message).toBe(MESSAGES.emailChangeCheckMail(othersEmail))
    expect(await testDb()('mail_outbox').where({ to_address: othersEmail, template: 'account-confirm-new' }).count()).toEqual([{ count: '0' }])
    expect((await client.get('/api/me')).body.user.email).toBe(email)
  })

  it('refuses 401 signed out and 400 for a bad address', async () => {
    expect((await new ApiClient(baseUrl).post('/api/me/email', { email: uniqueEmail(), password: GOOD_PASSWORD })).status).toBe(401)
    const { client } = await signedUpClient(baseUrl)
    const bad = await client.post('/api/me/email', { email: 'nowhere', password: GOOD_PASSWORD })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.email).toEqual(['Enter an e-mail address like name@example.org.'])
  })
})
