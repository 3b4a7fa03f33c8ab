// Deleting one's own account through DELETE /api/me, against the real server and PostgreSQL:
// refused while the caller is the only organiser of a competition not yet over (409 naming
// it), or without the password and the typed confirmation; otherwise an open entry is withdrawn
// (the office e-mailed), a past competition's entry stays with the pilot's name replaced and
// the contact fields cleared, the licence and medical documents go (rows and files), every
// session ends, the old address no longer signs in and can sign up again.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { postForm, storedFileCount, tinyPdf } from '../../../support/files'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const CONFIRM = { password: GOOD_PASSWORD, confirm: 'delete' }

/** The message to `to` whose subject starts so, once the capture has it. */
async function mailTo(to: string, subjectStart: string) {
  for (let count = 1; ; count++) {
    const hit = (await waitForMail(to, { count })).find(m => m.subject.startsWith(subjectStart))
    if (hit) return hit
  }
}

describe('deletion is refused', () => {
  it('while the caller is the only organiser of a competition not yet over (409 naming it)', async () => {
    const { client, user } = await signedUpClient(baseUrl, 'Sole Organiser')
    await createCompetition('Unfinished Gliding Week', [{ userId: user.id, role: 'organiser' }])
    const res = await client.request('DELETE', '/api/me', CONFIRM)
    expect(res.status).toBe(409)
    expect(res.body.message).toContain('“Unfinished Gliding Week”')
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await testDb()('users').where({ id: user.id }).first()).deleted_at).toBeNull()
  })

  it('without the right password or the typed word, and for a signed-out caller', async () => {
    const { client, user } = await signedUpClient(baseUrl, 'Hesitant Pilot')
    const wrong = await client.request('DELETE', '/api/me', { password: 'not the password', confirm: 'delete' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fieldErrors.password[0]).toContain('not your password')
    const unconfirmed = await client.request('DELETE', '/api/me', { password: GOOD_PASSWORD, confirm: 'yes' })
    expect(unconfirmed.status).toBe(400)
    expect(unconfirmed.body.data.fieldErrors.confirm).toEqual(['Type the word delete to confirm.'])
    expect((await new ApiClient(baseUrl).request('DELETE', '/api/me', CONFIRM)).status).toBe(401)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await testDb()('users').where({ id: user.id }).first()).deleted_at).toBeNull()
  })
})

describe('deletion', () => {
  let leaving: Awaited<ReturnType<typeof signedUpClient>>
  let office: Awaited<ReturnType<typeof signedUpClient>>
  let otherOrganiser: Awaited<ReturnType<typeof signedUpClient>>
  let pastCompetitionId: string
  let pastEntryId: string
  let openCompetitionId: string
  let openEntryId: string
  let sharedCompetitionId: string
  let phone: ApiClient

  beforeAll(async () => {
    leaving = await signedUpClient(baseUrl, 'Leaving Pilot')
    office = await signedUpClient(baseUrl, 'Open Office')
    otherOrganiser = await signedUpClient(baseUrl, 'Staying Organiser')
    // Past: arranged while open (so documents can be uploaded), then its days moved back.
    pastCompetitionId = await createCompetition('Last Year Cup', [{ userId: leaving.user.id, role: 'entrant' }])
    pastEntryId = await createEntry({ competitionId: pastCompetitionId, classId: await createClass(pastCompetitionId), entrantUserId: leaving.user.id, compId: 'PY', status: 'accepted' })
    await testDb()('entries').where({ id: pastEntryId }).update({ pilot_name: 'Leaving Pilot', pilot_phone: '+49 000 000', emergency_contact: 'Someone, +49 111', pilot_licence_number: 'LIC-1' })
    const docs = `/api/competitions/${pastCompetitionId}/entries/${pastEntryId}/documents`
    for (const kind of ['medical', 'licence', 'airworthiness']) {
      const up = await postForm(leaving.client, docs, { kind, expiresOn: '2027-12-31' }, { name: `${kind}.pdf`, data: tinyPdf(kind), type: 'application/pdf' })
      expect(up.status).toBe(201)
    }
    expect(storedFileCount('documents', pastEntryId)).toBe(3)
    await testDb()('competitions').where({ id: pastCompetitionId }).update({ first_contest_day: '2020-05-01', last_contest_day: '2020-05-07' })

    openCompetitionId = await createCompetition('Next Summer Open', [
      { userId: leaving.user.id, role: 'entrant' },
      { userId: office.user.id, role: 'organiser' },
    ])
    openEntryId = await createEntry({ competitionId: openCompetitionId, classId: await createClass(openCompetitionId), entrantUserId: leaving.user.id, compId: 'NS', status: 'submitted' })

    // Organiser together with someone else: the competition keeps its other organiser.
    sharedCompetitionId = await createCompetition('Shared Office Cup', [
      { userId: leaving.user.id, role: 'organiser' },
      { userId: otherOrganiser.user.id, role: 'organiser' },
    ])

    phone = new ApiClient(baseUrl)
    expect((await phone.post('/api/auth/login', { email: leaving.email, password: GOOD_PASSWORD })).status).toBe(200)
  })

  it('withdraws the open entry, keeps the past one anonymised, and signs out everywhere', async () => {
    const res = await leaving.client.request('DELETE', '/api/me', CONFIRM)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ ok: true, withdrawn: 1, kept: 1 })
    expect(res.headers.getSetCookie().some(c => /^gridmark-session=;/.test(c) || /gridmark-session=[^;]*;.*Max-Age=0/i.test(c))).toBe(true)

    expect((await leaving.client.get('/api/me')).status).toBe(401)
    expect((await phone.get('/api/me')).status).toBe(401)

    const open = await testDb()('entries').where({ id: openEntryId }).first()
    expect(open.status).toBe('withdrawn')
    const notice = await mailTo(office.email, 'Entry NS withdrawn')
    expect(notice.text).toContain('The reason given: The pilot deleted their Gridmark account.')

    const past = await testDb()('entries').where({ id: pastEntryId }).first()
    expect(past).toMatchObject({ status: 'accepted', pilot_name: 'Deleted account', pilot_phone: null, emergency_contact: null, pilot_licence_number: null })
    const documents = await testDb()('documents').where({ entry_id: pastEntryId }).pluck('kind')
    expect(documents).toEqual(['airworthiness'])
    expect(storedFileCount('documents', pastEntryId)).toBe(1)

    expect(await testDb()('memberships').where({ user_id: leaving.user.id }).count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }])
    expect(await testDb()('memberships').where({ competition_id: sharedCompetitionId, role: 'organiser' }).pluck('user_id')).toEqual([otherOrganiser.user.id])
    const row = await testDb()('users').where({ id: leaving.user.id }).first()
    expect(row.deleted_at).not.toBeNull()
    expect(row.email).not.toBe(leaving.email)
    expect(row.name).toBe('Deleted account')
    const audit = await testDb()('audit_log').where({ action: 'user.deleted', subject_id: leaving.user.id }).first()
    expect(audit.details).toMatchObject({ entriesWithdrawn: 1, entriesKept: 1, documentsDeleted: 2, sessionsEnded: 2 })
    const goodbye = await mailTo(leaving.email, 'Your Gridmark account was deleted')
    expect(goodbye.text).toContain('NS (Test Glider 15')
  })

  it('leaves the old address unable to sign in, and free to sign up again', async () => {
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email: leaving.email, password: GOOD_PASSWORD })).status).toBe(401)
    const again = await new ApiClient(baseUrl).post('/api/auth/signup', { email: leaving.email, name: 'Returning Pilot', password: GOOD_PASSWORD })
    expect(again.status).toBe(202)
    const fresh = await testDb()('users').where({ email: leaving.email.toLowerCase() }).first()
    expect(fresh).toBeDefined()
    expect(fresh.id).not.toBe(leaving.user.id)
    expect(fresh.email_verified_at).toBeNull()
  })
})
