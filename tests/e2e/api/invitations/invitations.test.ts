// Invitations: an organiser invites an official by e-mail; the signed, single-use link that
// expires creates the membership for the account of the invited address, signed in or signed
// up with it, and for no other.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, accountLinkOf, signedUpClient, uniqueEmail, GOOD_PASSWORD } from '../../../support/api'
import { closeTestDb, createCompetition, testDb } from '../../../support/db'
import { capturedMail, invitationLink, tokenOf, waitForMail } from '../../../support/mail'
import { MESSAGES } from '../../../../shared/constants/messages'
import { FORGOTTEN_BODY } from '../../../../shared/constants/mail-outbox'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let competitionId: string
let otherCompetitionId: string
let organiser: ApiClient
let scrutineer: ApiClient
let admin: ApiClient
let outsider: ApiClient
let scrutineerEmail: string

beforeAll(async () => {
  const o = await signedUpClient(baseUrl, 'Olive Organiser')
  const s = await signedUpClient(baseUrl, 'Sam Scrutineer')
  const a = await signedUpClient(baseUrl, 'Ada Admin')
  const x = await signedUpClient(baseUrl, 'Oscar Outsider')
  await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
  organiser = o.client
  scrutineer = s.client
  scrutineerEmail = s.user.email
  admin = a.client
  outsider = x.client
  competitionId = await createCompetition('Invite Open', [
    { userId: o.user.id, role: 'organiser' },
    { userId: s.user.id, role: 'scrutineer' },
  ])
  otherCompetitionId = await createCompetition('Invite Elsewhere', [{ userId: x.user.id, role: 'organiser' }])
})

async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const value = await read()
    if (ok(value)) return value
    if (Date.now() > deadline) throw new Error(`condition not met in time; last value: ${JSON.stringify(value)}`)
    await new Promise(r => setTimeout(r, 150))
  }
}

async function invite(email: string, role = 'scrutineer', client = organiser) {
  // An account's own address may hold its confirmation e-mail already.
  const before = (await capturedMail(email)).length
  const res = await client.post(`/api/competitions/${competitionId}/invitations`, { email, role })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const [mail] = await waitForMail(email, { count: before + 1 })
  return { invitation: res.body.invitation, mail: mail!, token: tokenOf(invitationLink(mail!)) }
}

describe('POST /api/competitions/:id/invitations', () => {
  it('queues an invitation e-mail with a link that the capture receives', async () => {
    const email = uniqueEmail('invitee')
    const res = await organiser.post(`/api/competitions/${competitionId}/invitations`, { email: `  ${email.toUpperCase()} `, role: 'director' })
    expect(res.status).toBe(201)
    expect(res.body.invitation).toMatchObject({ email, role: 'director', state: 'pending', invitedByName: 'Olive Organiser' })
    const expiresIn = new Date(res.body.invitation.expiresAt).getTime() - Date.now()
    expect(expiresIn).toBeGreaterThan(6.9 * 24 * 3600e3)
    expect(expiresIn).toBeLessThanOrEqual(7 * 24 * 3600e3)

    const [mail] = await waitForMail(email)
    expect(mail!.to).toEqual([email])
    expect(mail!.subject).toBe('Invitation: contest director at Invite Open')
    expect(mail!.text).toContain('Olive Organiser invites you to join Invite Open on Gridmark as contest director.')
    const link = invitationLink(mail!)
    expect(link.startsWith(`${baseUrl}/invitations/`)).toBe(true)
    expect(mail!.html).toContain(`href="${link}"`)
    expect(mail!.text).toContain(`Open the invitation:\n${link}`)

    // Only the token's hash is stored; an audit entry records the invitation.
    const row = await testDb()('invitations').where({ id: res.body.invitation.id }).first()
    expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/)
    expect(row.token_hash).not.toContain(tokenOf(link))
    const auditRow = await testDb()('audit_log').where({ action: 'invitation.create', subject_id: row.id }).first()
    expect(auditRow).toBeTruthy()
    const outbox = await testDb()('mail_outbox').where({ to_address: email }).first()
    expect(outbox).toMatchObject({ template: 'invitation', competition_id: competitionId })
  })

  it('answers 400 with field messages for a bad body', async () => {
    const bad = await organiser.post(`/api/competitions/${competitionId}/invitations`, { email: 'not-an-address', role: 'entrant' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.email).toEqual(['Enter an e-mail address like name@example.org.'])
    expect(bad.body.data.fieldErrors.role).toEqual(['Choose scrutineer, contest director or organiser.'])
    const notJson = await organiser.postRaw(`/api/competitions/${competitionId}/invitations`, '{oops')
    expect(notJson.status).toBe(400)
    expect(notJson.body.message).toBe(MESSAGES.invalidJson)
    const empty = await organiser.request('POST', `/api/competitions/${competitionId}/invitations`)
    expect(empty.status).toBe(400)
  })

  it('refuses 401 signed out, 403 for a scrutineer, 404 for another competition’s organiser', async () => {
    const body = { email: uniqueEmail(), role: 'scrutineer' }
    expect((await new ApiClient(baseUrl).post(`/api/competitions/${competitionId}/invitations`, body)).status).toBe(401)
    const forbidden = await scrutineer.post(`/api/competitions/${competitionId}/invitations`, body)
    expect(forbidden.status).toBe(403)
    expect(forbidden.body.message).toBe('This needs the organiser role in this competition.')
    expect((await outsider.post(`/api/competitions/${competitionId}/invitations`, body)).status).toBe(404)
    expect((await organiser.post(`/api/competitions/not-a-uuid/invitations`, body)).status).toBe(404)
    expect(await testDb()('invitations').where({ email: body.email }).first()).toBeUndefined()
    expect(await testDb()('mail_outbox').where({ to_address: body.email }).first()).toBeUndefined()
  })

  it('lets a site administrator invite, and refuses to invite someone who already holds the role', async () => {
    const email = uniqueEmail('by-admin')
    const res = await admin.post(`/api/competitions/${competitionId}/invitations`, { email, role: 'organiser' })
    expect(res.status).toBe(201)
    const clash = await organiser.post(`/api/competitions/${competitionId}/invitations`, { email: scrutineerEmail, role: 'scrutineer' })
    expect(clash.status).toBe(409)
    expect(clash.body.message).toBe(MESSAGES.alreadyHoldsRole)
  })

  it('replaces a waiting invitation to the same address and role', async () => {
    const email = uniqueEmail('twice')
    const first = await invite(email)
    const second = await organiser.post(`/api/competitions/${competitionId}/invitations`, { email, role: 'scrutineer' })
    expect(second.status).toBe(201)
    const preview = await new ApiClient(baseUrl).get(`/api/invitations/${first.token}`)
    expect(preview.status).toBe(410)
    expect(preview.body.message).toBe(MESSAGES.invitationRevoked)
  })
})

describe('GET /api/competitions/:id/invitations', () => {
  it('lists every invitation with its state, for organisers only', async () => {
    const pending = await invite(uniqueEmail('listed'))
    const expired = await invite(uniqueEmail('listed-old'))
    await testDb()('invitations').where({ id: expired.invitation.id }).update({ expires_at: new Date(Date.now() - 1000) })
    const res = await organiser.get(`/api/competitions/${competitionId}/invitations`)
    expect(res.status).toBe(200)
    const byId = new Map(res.body.invitations.map((i: { id: string, state: string }) => [i.id, i.state]))
    expect(byId.get(pending.invitation.id)).toBe('pending')
    expect(byId.get(expired.invitation.id)).toBe('expired')
    expect((await scrutineer.get(`/api/competitions/${competitionId}/invitations`)).status).toBe(403)
    expect((await outsider.get(`/api/competitions/${competitionId}/invitations`)).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(`/api/competitions/${competitionId}/invitations`)).status).toBe(401)
  })
})

describe('GET /api/invitations/:token and accepting', () => {
  it('shows what a link invites to, to anyone holding it', async () => {
    const email = uniqueEmail('preview')
    const { token } = await invite(email, 'scrutineer')
    const res = await new ApiClient(baseUrl).get(`/api/invitations/${token}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      role: 'scrutineer',
      email,
      invitedByName: 'Olive Organiser',
      competition: { id: competitionId, name: 'Invite Open', airfieldName: 'Test Field', firstContestDay: '2027-05-01', lastContestDay: '2027-05-07' },
    })
  })

  it('answers 404 with a sentence for a malformed, forged or unknown token', async () => {
    const { token } = await invite(uniqueEmail('forged'))
    const [random, signature] = token.split('.') as [string, string]
    const flipped = `${random}.${signature.startsWith('A') ? 'B' : 'A'}${signature.slice(1)}`
    for (const bad of ['nonsense', `${random}.${random}`, flipped, `${'x'.repeat(43)}.${'y'.repeat(43)}`]) {
      const res = await new ApiClient(baseUrl).get(`/api/invitations/${bad}`)
      expect(res.status, bad).toBe(404)
      expect(res.body.message).toBe(MESSAGES.invitationInvalid)
      const accept = await organiser.post(`/api/invitations/${bad}/accept`)
      expect(accept.status).toBe(404)
    }
  })

  it('a new account signs up, accepts, and holds the role; the link then refuses a second use', async () => {
    const email = uniqueEmail('newcomer')
    const { token, invitation } = await invite(email, 'scrutineer')

    const signedOut = await new ApiClient(baseUrl).post(`/api/invitations/${token}/accept`)
    expect(signedOut.status).toBe(401)

    const newcomer = new ApiClient(baseUrl)
    const signup = await newcomer.post('/api/auth/signup', { email, name: 'Nia Newcomer', password: GOOD_PASSWORD })
    expect(signup.status).toBe(202)
    // Not before the address is confirmed: the confirmation link signs the newcomer in.
    const [confirmation] = await waitForMail(email, { count: 2 }).then(all => all.filter(m => m.subject.startsWith('Confirm')))
    const confirmed = await newcomer.post('/api/auth/verification/confirm', { token: accountLinkOf(confirmation!, '/verify-email').token })
    expect(confirmed.status).toBe(200)
    const accepted = await newcomer.post(`/api/invitations/${token}/accept`)
    expect(accepted.status).toBe(200)
    expect(accepted.body).toEqual({ competitionId, role: 'scrutineer' })

    const detail = await newcomer.get(`/api/competitions/${competitionId}`)
    expect(detail.status).toBe(200)
    expect(detail.body.roles).toEqual(['scrutineer'])
    const me = await newcomer.get('/api/me')
    expect(me.body.memberships.find((m: { competitionId: string }) => m.competitionId === competitionId).roles).toEqual(['scrutineer'])

    // Single use: neither the same person nor anyone else can use it again.
    const again = await newcomer.post(`/api/invitations/${token}/accept`)
    expect(again.status).toBe(410)
    expect(again.body.message).toBe(MESSAGES.invitationUsed)
    const other = await outsider.post(`/api/invitations/${token}/accept`)
    expect(other.status).toBe(410)
    expect((await outsider.get(`/api/competitions/${competitionId}`)).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(`/api/invitations/${token}`)).status).toBe(410)

    const list = await organiser.get(`/api/competitions/${competitionId}/invitations`)
    expect(list.body.invitations.find((i: { id: string }) => i.id === invitation.id)).toMatchObject({ state: 'accepted', acceptedByName: 'Nia Newcomer' })
    expect(await testDb()('audit_log').where({ action: 'invitation.accept', subject_id: invitation.id }).first()).toBeTruthy()
  })

  it('works for an existing account right after sign-in', async () => {
    const existing = await signedUpClient(baseUrl, 'Erin Existing')
    const { token } = await invite(existing.email, 'director')
    const fresh = new ApiClient(baseUrl)
    expect((await fresh.post('/api/auth/login', { email: existing.email, password: GOOD_PASSWORD })).status).toBe(200)
    const res = await fresh.post(`/api/invitations/${token}/accept`)
    expect(res.status).toBe(200)
    expect((await fresh.get(`/api/competitions/${competitionId}`)).body.roles).toEqual(['director'])
  })

  it('an expired link answers 410 and creates nothing', async () => {
    const late = await signedUpClient(baseUrl, 'Lee Late')
    const { token, invitation } = await invite(late.email)
    await testDb()('invitations').where({ id: invitation.id }).update({ expires_at: new Date(Date.now() - 60_000) })
    const preview = await new ApiClient(baseUrl).get(`/api/invitations/${token}`)
    expect(preview.status).toBe(410)
    expect(preview.body.message).toBe(MESSAGES.invitationExpired)
    const res = await late.client.post(`/api/invitations/${token}/accept`)
    expect(res.status).toBe(410)
    expect(res.body.message).toBe(MESSAGES.invitationExpired)
    expect(await testDb()('memberships').where({ user_id: late.user.id }).first()).toBeUndefined()
  })

  it('two accepts at the same moment (the invitee on two devices): exactly one wins', async () => {
    const invitee = await signedUpClient(baseUrl, 'Racer A')
    const { token } = await invite(invitee.email)
    const other = new ApiClient(baseUrl)
    expect((await other.post('/api/auth/login', { email: invitee.email, password: GOOD_PASSWORD })).status).toBe(200)
    const results = await Promise.all([invitee.client.post(`/api/invitations/${token}/accept`), other.post(`/api/invitations/${token}/accept`)])
    expect(results.map(r => r.status).sort()).toEqual([200, 410])
    const members = await testDb()('memberships').where({ user_id: invitee.user.id, competition_id: competitionId })
    expect(members).toHaveLength(1)
  })
})

describe('an invitation is bound to the invited address', () => {
  it('refuses another signed-in account with 403 naming the invited address; the invited account then accepts', async () => {
    const invitee = await signedUpClient(baseUrl, 'Ivy Invitee')
    const { token, invitation } = await invite(invitee.email, 'organiser')

    // Someone else holding the link — even a member of the competition — cannot take the role.
    for (const wrong of [outsider, scrutineer]) {
      const refused = await wrong.post(`/api/invitations/${token}/accept`)
      expect(refused.status).toBe(403)
      expect(refused.body.message).toBe(MESSAGES.invitationForOtherAddress(invitee.email))
      expect(refused.body.message).toContain(invitee.email)
    }
    const scrutineerRoles = await testDb()('memberships as m').join('users as u', 'u.id', 'm.user_id')
      .where({ 'u.email': scrutineerEmail, 'm.competition_id': competitionId }).pluck('m.role')
    expect(scrutineerRoles).toEqual(['scrutineer'])
    expect((await outsider.get(`/api/competitions/${competitionId}`)).status).toBe(404)
    expect((await testDb()('invitations').where({ id: invitation.id }).first()).accepted_at).toBeNull()

    // The link still works for its own address, signed in with any spelling of it.
    const fresh = new ApiClient(baseUrl)
    expect((await fresh.post('/api/auth/login', { email: invitee.email.toUpperCase(), password: GOOD_PASSWORD })).status).toBe(200)
    const accepted = await fresh.post(`/api/invitations/${token}/accept`)
    expect(accepted.status).toBe(200)
    expect(accepted.body).toEqual({ competitionId, role: 'organiser' })
    expect((await invitee.client.get(`/api/competitions/${competitionId}`)).body.roles).toEqual(['organiser'])
  })

  it('compares the account’s current address, not the one its session began with', async () => {
    const mover = await signedUpClient(baseUrl, 'Max Mover')
    const { token } = await invite(mover.email)
    // The account's address changes while its session stays open (as a change of address would).
    await testDb()('users').where({ id: mover.user.id }).update({ email: uniqueEmail('moved') })
    const refused = await mover.client.post(`/api/invitations/${token}/accept`)
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe(MESSAGES.invitationForOtherAddress(mover.email))
  })

  it('keeps no usable link: the table holds only a hash, the sent e-mail’s body is emptied', async () => {
    const email = uniqueEmail('no-plain')
    const { token, invitation } = await invite(email)
    const [random] = token.split('.') as [string, string]

    const row = await testDb()('invitations').where({ id: invitation.id }).first()
    expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(JSON.stringify(row)).not.toContain(random)

    // Once the worker has sent the message, its row keeps who, when and which message, no link.
    const outbox = await until(() => testDb()('mail_outbox').where({ to_address: email }).first(), r => r?.sent_at != null)
    expect(outbox).toMatchObject({ template: 'invitation', secret_body: true, html_body: null, text_body: FORGOTTEN_BODY })
    expect(outbox.subject).toBe('Invitation: scrutineer at Invite Open')
    expect(JSON.stringify(outbox)).not.toContain(random)
    // Nowhere else in the database either (the audit trail included).
    const dump = await testDb().raw(`SELECT count(*)::int AS n FROM audit_log a WHERE a::text LIKE ?`, [`%${random}%`])
    expect(dump.rows[0].n).toBe(0)

    // The organiser's list shows no link; a new invitation (a "resend") sends a new one.
    const list = await organiser.get(`/api/competitions/${competitionId}/invitations`)
    expect(JSON.stringify(list.body)).not.toContain(random)
    const again = await organiser.post(`/api/competitions/${competitionId}/invitations`, { email, role: 'scrutineer' })
    expect(again.status).toBe(201)
    const tokens = (await waitForMail(email, { count: 2 })).map(m => tokenOf(invitationLink(m)))
    expect(new Set(tokens).size).toBe(2)
    const newToken = tokens.find(t => t !== token)!
    expect((await new ApiClient(baseUrl).get(`/api/invitations/${token}`)).status).toBe(410)
    expect((await new ApiClient(baseUrl).get(`/api/invitations/${newToken}`)).status).toBe(200)
  })

  it('other e-mail keeps its body after sending', async () => {
    const [row] = await testDb()('mail_outbox')
      .insert({ to_address: uniqueEmail('plain'), subject: 'Plain', text_body: 'Kept as sent', template: 'test' })
      .returning('id')
    const sent = await until(() => testDb()('mail_outbox').where({ id: row.id }).first(), r => r?.sent_at != null)
    expect(sent).toMatchObject({ text_body: 'Kept as sent', secret_body: false })
  })
})

describe('DELETE /api/competitions/:id/invitations/:invitationId', () => {
  it('withdraws a waiting invitation; its link then says so', async () => {
    const { token, invitation } = await invite(uniqueEmail('withdrawn'))
    expect((await scrutineer.request('DELETE', `/api/competitions/${competitionId}/invitations/${invitation.id}`)).status).toBe(403)
    expect((await outsider.request('DELETE', `/api/competitions/${competitionId}/invitations/${invitation.id}`)).status).toBe(404)
    expect((await new ApiClient(baseUrl).request('DELETE', `/api/competitions/${competitionId}/invitations/${invitation.id}`)).status).toBe(401)
    // Another competition's organiser cannot reach it through their own competition either.
    expect((await outsider.request('DELETE', `/api/competitions/${otherCompetitionId}/invitations/${invitation.id}`)).status).toBe(404)

    const res = await organiser.request('DELETE', `/api/competitions/${competitionId}/invitations/${invitation.id}`)
    expect(res.status).toBe(200)
    expect(res.body.invitation.state).toBe('revoked')
    const preview = await new ApiClient(baseUrl).get(`/api/invitations/${token}`)
    expect(preview.status).toBe(410)
    expect(preview.body.message).toBe(MESSAGES.invitationRevoked)
    const someone = await signedUpClient(baseUrl, 'Rita Revoked')
    expect((await someone.client.post(`/api/invitations/${token}/accept`)).status).toBe(410)

    const twice = await organiser.request('DELETE', `/api/competitions/${competitionId}/invitations/${invitation.id}`)
    expect(twice.status).toBe(409)
    expect(twice.body.message).toBe(MESSAGES.invitationNotPending)
    expect(await testDb()('audit_log').where({ action: 'invitation.revoke', subject_id: invitation.id }).first()).toBeTruthy()
  })

  it('answers 404 for an unknown or malformed invitation id', async () => {
    const unknown = await organiser.request('DELETE', `/api/competitions/${competitionId}/invitations/00000000-0000-4000-8000-000000000000`)
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toBe(MESSAGES.invitationNotFound)
    expect((await organiser.request('DELETE', `/api/competitions/${competitionId}/invitations/nope`)).status).toBe(404)
  })
})
