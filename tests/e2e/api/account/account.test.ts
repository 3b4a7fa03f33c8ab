// The account page's routes against the real server and PostgreSQL: a new name (entries keep
// the pilot's name as entered), a new password (every other session ends at once, the current
// one stays, the old password stops working, the address is e-mailed; a wrong current password
// is refused), and the data export (the caller's entries and documents' metadata, never a
// password hash, never another person's data).
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { postForm, tinyPdf } from '../../../support/files'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const NEW_PASSWORD = 'another long passphrase'

describe('PATCH /api/me — the name', () => {
  it('renames the account, audited without the name; an entry keeps its pilot name', async () => {
    const { client, user } = await signedUpClient(baseUrl, 'Old Name')
    const competitionId = await createCompetition('Rename Cup', [{ userId: user.id, role: 'entrant' }])
    const entryId = await createEntry({ competitionId, classId: await createClass(competitionId), entrantUserId: user.id })

    const res = await client.request('PATCH', '/api/me', { name: '  Renamed Pilot ' })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ id: user.id, name: 'Renamed Pilot' })
    expect((await client.get('/api/me')).body.user.name).toBe('Renamed Pilot')
    expect((await testDb()('entries').where({ id: entryId }).first()).pilot_name).toBe('Test Pilot')
    const audit = await testDb()('audit_log').where({ action: 'user.renamed', subject_id: user.id }).first()
    expect(audit.actor_user_id).toBe(user.id)
    expect(JSON.stringify(audit.details)).not.toContain('Renamed')
  })

  it('refuses an empty name, a control character and a signed-out caller', async () => {
    const { client } = await signedUpClient(baseUrl, 'Kept Name')
    const empty = await client.request('PATCH', '/api/me', { name: '   ' })
    expect(empty.status).toBe(400)
    expect(empty.body.data.fieldErrors.name).toEqual(['Enter your name.'])
    const nul = await client.request('PATCH', '/api/me', { name: 'A\u0000B' })
    expect(nul.status).toBe(400)
    expect(nul.body.data.fieldErrors.name).toBeTruthy()
    expect((await client.get('/api/me')).body.user.name).toBe('Kept Name')
    expect((await new ApiClient(baseUrl).request('PATCH', '/api/me', { name: 'Nobody' })).status).toBe(401)
  })
})

describe('POST /api/me/password', () => {
  it('ends every other session at once, keeps this one, retires the old password and e-mails the owner', async () => {
    const { client, email, user } = await signedUpClient(baseUrl, 'Two Devices')
    const phone = new ApiClient(baseUrl)
    expect((await phone.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await phone.get('/api/me')).status).toBe(200)

    const res = await client.post('/api/me/password', { currentPassword: GOOD_PASSWORD, newPassword: NEW_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ signedOut: 1 })

    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await client.get('/api/me')).status).toBe(200)
    const stranger = new ApiClient(baseUrl)
    expect((await stranger.post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(401)
    expect((await stranger.post('/api/auth/login', { email, password: NEW_PASSWORD })).status).toBe(200)

    const [mail] = await waitForMail(email)
    expect(mail!.subject).toBe('Your Gridmark password was changed')
    expect(mail!.text).toContain('Every other device where you were signed in has been signed out')
    const audit = await testDb()('audit_log').where({ action: 'user.password-changed', subject_id: user.id }).first()
    expect(audit.details).toEqual({ otherSessionsEnded: 1 })
  })

  it('refuses a wrong current password (400 beside it) and a short new one, changing nothing', async () => {
    const { client, email } = await signedUpClient(baseUrl, 'Careful Pilot')
    const wrong = await client.post('/api/me/password', { currentPassword: 'not my password', newPassword: NEW_PASSWORD })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fieldErrors.currentPassword[0]).toContain('not your current password')
    const short = await client.post('/api/me/password', { currentPassword: GOOD_PASSWORD, newPassword: 'short' })
    expect(short.status).toBe(400)
    expect(short.body.data.fieldErrors.newPassword).toEqual(['Use at least 10 characters.'])
    const same = await client.post('/api/me/password', { currentPassword: GOOD_PASSWORD, newPassword: GOOD_PASSWORD })
    expect(same.status).toBe(400)
    expect(same.body.data.fieldErrors.newPassword[0]).toContain('same as the current one')
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(200)
  })

  it('counts wrong current passwords like failed sign-ins: the tenth is the last checked', async () => {
    const { client } = await signedUpClient(baseUrl, 'Guessed Pilot')
    const statuses: number[] = []
    for (let i = 0; i < 11; i++) {
      statuses.push((await client.post('/api/me/password', { currentPassword: `guess number ${i}`, newPassword: NEW_PASSWORD })).status)
    }
    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(400))
    expect(statuses[10]).toBe(429)
  })
})

describe('GET /api/me/export', () => {
  it('is an attachment holding the caller’s entries and documents’ metadata, no password hash and nobody else’s data', async () => {
    const me = await signedUpClient(baseUrl, 'Exporting Pilot')
    const other = await signedUpClient(baseUrl, 'Neighbour Pilot')
    const competitionId = await createCompetition('Export Cup', [
      { userId: me.user.id, role: 'entrant' },
      { userId: other.user.id, role: 'entrant' },
    ])
    const classId = await createClass(competitionId)
    const mine = await createEntry({ competitionId, classId, entrantUserId: me.user.id, compId: 'EX1' })
    const theirs = await createEntry({ competitionId, classId, entrantUserId: other.user.id, compId: 'EX2' })
    const upload = await postForm(me.client, `/api/competitions/${competitionId}/entries/${mine}/documents`,
      { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'insurance.pdf', data: tinyPdf('Insurance'), type: 'application/pdf' })
    expect(upload.status).toBe(201)
    const medical = await postForm(me.client, `/api/competitions/${competitionId}/entries/${mine}/documents`,
      { kind: 'medical', expiresOn: '2027-12-31' }, { name: 'medical.pdf', data: tinyPdf('Medical'), type: 'application/pdf' })
    expect(medical.status).toBe(201)
    expect((await me.client.get(`/api/competitions/${competitionId}/entries/${mine}/documents/${medical.body.document.id}/file`)).status).toBe(200)

    const res = await me.client.get('/api/me/export')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="gridmark-my-data-\d{4}-\d{2}-\d{2}\.json"$/)
    expect(res.headers.get('content-type')).toContain('application/json')
    const data = res.body
    expect(data.format).toBe('gridmark-account-export')
    expect(data.account).toMatchObject({ id: me.user.id, email: me.email, name: 'Exporting Pilot' })
    expect(data.memberships).toEqual([expect.objectContaining({ competition_id: competitionId, role: 'entrant', competition_name: 'Export Cup' })])
    expect(data.entries.map((e: { id: string }) => e.id)).toEqual([mine])
    expect(data.entries[0]).toMatchObject({ comp_id: 'EX1', competition_name: 'Export Cup' })
    expect(data.entries[0].documents).toEqual([
      expect.objectContaining({ kind: 'insurance', original_filename: 'insurance.pdf', file_deleted_at: null }),
      expect.objectContaining({ kind: 'medical', original_filename: 'medical.pdf' }),
    ])
    // Who opened the pilot's medical file (here the pilot), without the viewer's address; and what they opened themselves.
    expect(data.entries[0].documentOpenings).toEqual([expect.objectContaining({ document_kind: 'medical', viewer_name: 'Exporting Pilot', viewer_role: 'entrant' })])
    expect(data.entries[0].documentOpenings[0].client_address).toBeUndefined()
    expect(data.documentsOpened).toEqual([expect.objectContaining({ entry_id: mine, document_kind: 'medical', client_address: me.client.address })])
    expect(data.entries[0].documents[0].storage_key).toBeUndefined()
    expect(data.entries[0].findings.length).toBeGreaterThan(0)
    expect(data.sessions.length).toBeGreaterThan(0)
    expect(data.auditLog.some((a: { action: string }) => a.action === 'user.signed-up')).toBe(true)
    expect(data.auditLog.some((a: { action: string }) => a.action === 'document.uploaded')).toBe(true)

    const text = JSON.stringify(data)
    expect(text).not.toMatch(/password_hash|\$scrypt/)
    expect(text).not.toContain(theirs)
    expect(text).not.toContain(other.user.id)
    expect(text).not.toContain(other.email)
    expect((await new ApiClient(baseUrl).get('/api/me/export')).status).toBe(401)
  })
})
