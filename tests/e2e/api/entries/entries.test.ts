// Entrant registration through the real routes: joining, the dossier, audited changes,
// uniqueness of competition and radio IDs, the edit window, and the status flow with its e-mails.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createCompetition, createClass, testDb } from '../../../support/db'
import {
  auditRows, collisionWarningUnit, completeEntry, createEntryVia, entriesWorld, entryBody, flightRecorderUnit,
  mailRows, type EntriesWorld,
} from '../../../support/entries'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: EntriesWorld
let entryId: string
const path = (id = entryId) => `/api/competitions/${w.competitionId}/entries/${id}`

beforeAll(async () => {
  w = await entriesWorld(baseUrl)
})

describe('open competitions', () => {
  it('lists a competition open for registration with its classes to any signed-in user', async () => {
    const res = await w.outsider.client.get('/api/competitions/open')
    expect(res.status).toBe(200)
    const ours = res.body.competitions.find((c: { competitionId: string }) => c.competitionId === w.competitionId)
    expect(ours).toMatchObject({ name: 'Entries Cup', myEntries: 0 })
    expect(ours.classes.map((c: { name: string }) => c.name).sort()).toEqual(['Club', 'Standard'])
  })

  it('leaves out a competition whose registration has closed or not opened yet', async () => {
    const closed = await createCompetition('Closed Cup')
    await createClass(closed)
    await testDb()('competitions').where({ id: closed }).update({ registration_closes_on: '2020-01-01' })
    const later = await createCompetition('Later Cup')
    await createClass(later)
    await testDb()('competitions').where({ id: later }).update({ registration_opens_on: '2099-01-01' })
    const res = await w.outsider.client.get('/api/competitions/open')
    const ids = res.body.competitions.map((c: { competitionId: string }) => c.competitionId)
    expect(ids).not.toContain(closed)
    expect(ids).not.toContain(later)
  })

  it('answers 401 when not signed in', async () => {
    expect((await w.anonymous.get('/api/competitions/open')).status).toBe(401)
  })
})

describe('joining with an entry', () => {
  it('answers 401 when not signed in', async () => {
    const res = await w.anonymous.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId))
    expect(res.status).toBe(401)
  })

  it('answers 400 with per-field messages for a bad body', async () => {
    const res = await w.entrant.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'TOOLONG', pilotName: '' }))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.compId).toEqual(['A competition ID is 1 to 3 letters or digits.'])
    expect(res.body.data.fieldErrors.pilotName).toEqual(['Enter the pilot’s name.'])
  })

  it('refuses a class of another competition on the class field', async () => {
    const elsewhere = await createCompetition('Elsewhere Cup')
    const foreignClass = await createClass(elsewhere)
    const res = await w.entrant.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(foreignClass))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.classId).toEqual(['Choose one of this competition’s classes.'])
  })

  it('creates a draft, makes the caller an entrant in the same step and audits both', async () => {
    const res = await w.entrant.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId))
    expect(res.status).toBe(201)
    entryId = res.body.id
    const row = await testDb()('entries').where({ id: entryId }).first()
    expect(row).toMatchObject({ status: 'draft', comp_id: 'KT', pilot_nationality: 'GB', entrant_user_id: w.entrant.user.id, crew_names: ['Ray Retrieve'] })
    const roles = await testDb()('memberships').where({ user_id: w.entrant.user.id, competition_id: w.competitionId }).pluck('role')
    expect(roles).toEqual(['entrant'])
    expect((await auditRows(entryId, 'entry.created')).length).toBe(1)
    const joined = await testDb()('audit_log').where({ competition_id: w.competitionId, action: 'membership.joined', actor_user_id: w.entrant.user.id })
    expect(joined.length).toBe(1)
  })

  it('answers 409 naming the clash when the competition ID is taken, in any case', async () => {
    const res = await w.otherEntrant.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'kt', pilotName: 'Otto Other', registration: 'G-OTTO' }))
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('Competition ID KT is already taken by Erin Entrant (G-KTST).')
    expect(res.body.data.field).toBe('compId')
    // The refused request left nothing behind: no entry, no membership.
    expect(await testDb()('memberships').where({ user_id: w.otherEntrant.user.id, competition_id: w.competitionId }).first()).toBeUndefined()
  })

  it('lets only one of two simultaneous entries take the same competition ID', async () => {
    const [a, b] = await Promise.all([
      w.otherEntrant.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'ZZ9', registration: 'G-AAAA' })),
      w.outsider.client.post(`/api/competitions/${w.competitionId}/entries`, entryBody(w.classId, { compId: 'zz9', registration: 'G-BBBB' })),
    ])
    expect([a.status, b.status].sort()).toEqual([201, 409])
    expect(await testDb()('entries').where({ competition_id: w.competitionId }).whereRaw(`upper(comp_id) = 'ZZ9'`).count('* as n').first()).toEqual({ n: '1' })
    // Tidy up so the later tests see our world as arranged.
    const winner = a.status === 201 ? a : b
    await testDb()('entries').where({ id: winner.body.id }).update({ status: 'withdrawn' })
  })

  it('answers 404 to a non-member when registration is closed, and 403 to a member', async () => {
    const closed = await createCompetition('Shut Cup', [{ userId: w.entrant.user.id, role: 'entrant' }])
    const cls = await createClass(closed)
    await testDb()('competitions').where({ id: closed }).update({ registration_closes_on: '2020-01-01' })
    const outsider = await w.outsider.client.post(`/api/competitions/${closed}/entries`, entryBody(cls))
    expect(outsider.status).toBe(404)
    const member = await w.entrant.client.post(`/api/competitions/${closed}/entries`, entryBody(cls))
    expect(member.status).toBe(403)
    expect(member.body.message).toBe('Registration for this competition is not open.')
  })
})

describe('the dossier', () => {
  it('shows the owner the whole dossier with progress and permissions', async () => {
    const res = await w.entrant.client.get(path())
    expect(res.status).toBe(200)
    expect(res.body.entry).toMatchObject({ id: entryId, compId: 'KT', spanM: 15, mtomKg: 525, status: 'draft', entrantName: 'Erin Entrant', paymentStatus: 'unpaid' })
    expect(res.body.entryClass).toMatchObject({ id: w.classId, name: 'Standard', maxMtomKg: 525 })
    expect(res.body.units).toEqual([])
    expect(res.body.documents).toEqual([])
    expect(res.body.progress.submittable).toBe(false)
    expect(res.body.progress.missing.map((m: { text: string }) => m.text)).toContain('Add the collision-warning unit.')
    expect(res.body.can).toMatchObject({ edit: true, submit: true, withdraw: true, decide: false })
  })

  it('lets a scrutineer read it, but not change it', async () => {
    const res = await w.scrutineer.client.get(path())
    expect(res.status).toBe(200)
    expect(res.body.can).toMatchObject({ edit: false, submit: false, withdraw: false, decide: false })
    const patch = await w.scrutineer.client.request('PATCH', path(), { pilotPhone: '123' })
    expect(patch.status).toBe(403)
    expect(patch.body.message).toBe('Only the entry’s entrant or the organiser can change it.')
  })

  it('answers 404 to another entrant and to a non-member, 401 when signed out, 404 for a malformed id', async () => {
    await createEntryVia(w.otherEntrant.client, w.competitionId, entryBody(w.classId, { compId: 'OT', registration: 'G-OTTO', pilotName: 'Otto Other' }))
    for (const client of [w.otherEntrant.client, w.outsider.client]) {
      const res = await client.get(path())
      expect(res.status).toBe(404)
    }
    expect((await w.otherEntrant.client.get(path())).body.message).toBe('No such entry in this competition, or it is not yours.')
    expect((await w.anonymous.get(path())).status).toBe(401)
    expect((await w.entrant.client.get(`/api/competitions/${w.competitionId}/entries/nope`)).status).toBe(404)
  })
})

describe('changing an entry', () => {
  it('records one audit row per changed field: old and new value, or only that a personal field changed', async () => {
    const res = await w.entrant.client.request('PATCH', path(), { pilotPhone: '+44 7700 900999', spanM: 15, mtomKg: 500, registration: 'G-KTST' })
    expect(res.status).toBe(200)
    expect(res.body.entry).toMatchObject({ pilotPhone: '+44 7700 900999', mtomKg: 500 })
    const rows = await auditRows(entryId, 'entry.updated')
    expect(rows.map(r => r.details)).toEqual([
      { field: 'pilotPhone', changed: true },
      { field: 'mtomKg', from: 525, to: 500 },
    ])
    expect(rows.every(r => r.actor_user_id === w.entrant.user.id)).toBe(true)
  })

  it('clears optional text and numbers sent as null or an empty string', async () => {
    const res = await w.entrant.client.request('PATCH', path(), { copilotName: null, datumDescription: '', emptyMassKg: null })
    expect(res.status).toBe(200)
    expect(res.body.entry).toMatchObject({ copilotName: null, datumDescription: null, emptyMassKg: null })
    const row = await testDb()('entries').where({ id: entryId }).first()
    expect(row.copilot_name).toBeNull()
    expect(row.datum_description).toBeNull()
    const cleared = (await auditRows(entryId, 'entry.updated')).map(r => r.details).filter(d => d.to === null || d.field === 'copilotName')
    expect(cleared.map(d => d.field).sort()).toEqual(['copilotName', 'datumDescription', 'emptyMassKg'])
    // Put the empty mass back for submitting later.
    await w.entrant.client.request('PATCH', path(), { emptyMassKg: 255 })
  })

  it('refuses to clear a required field, and other bad values, with 400 on the field', async () => {
    const res = await w.entrant.client.request('PATCH', path(), { pilotName: '', spanM: 'long' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.pilotName).toEqual(['Enter the pilot’s name.'])
    expect(res.body.data.fieldErrors.spanM).toBeTruthy()
    const order = await w.entrant.client.request('PATCH', path(), { cgForwardLimitM: 0.4, cgAftLimitM: 0.2 })
    expect(order.status).toBe(400)
    expect(order.body.data.fieldErrors.cgAftLimitM).toEqual(['The forward CG limit must lie ahead of the aft limit.'])
  })

  it('answers 409 naming the clash when changing to a taken competition ID', async () => {
    const res = await w.entrant.client.request('PATCH', path(), { compId: 'ot' })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('Competition ID OT is already taken by Otto Other (G-OTTO).')
  })

  it('after registration closes: refuses the entrant, lets the organiser change it (audited)', async () => {
    const competitionId = await createCompetition('Late Cup', [{ userId: w.organiser.user.id, role: 'organiser' }])
    const cls = await createClass(competitionId)
    const id = await createEntryVia(w.entrant.client, competitionId, entryBody(cls))
    await testDb()('competitions').where({ id: competitionId }).update({ registration_closes_on: '2020-03-01' })
    const p = `/api/competitions/${competitionId}/entries/${id}`

    const refused = await w.entrant.client.request('PATCH', p, { pilotPhone: '1' })
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe('Registration closed on 1 March 2020: only the organiser can change this entry now.')
    const unit = await w.entrant.client.post(`${p}/units`, flightRecorderUnit())
    expect(unit.status).toBe(403)
    expect((await w.entrant.client.get(p)).body.can).toMatchObject({ edit: false, submit: false, withdraw: true })
    const submit = await w.entrant.client.post(`${p}/submit`)
    expect(submit.status).toBe(403)
    expect(submit.body.message).toBe('Registration closed on 1 March 2020: only the organiser can change this entry now.')

    const allowed = await w.organiser.client.request('PATCH', p, { pilotPhone: '+44 1' })
    expect(allowed.status).toBe(200)
    const rows = await auditRows(id, 'entry.updated')
    expect(rows.map(r => [r.actor_user_id, r.details.field])).toEqual([[w.organiser.user.id, 'pilotPhone']])
  })
})

describe('units', () => {
  let unitId: string

  it('adds a collision-warning unit (radio ID in upper case) and audits it', async () => {
    const res = await w.entrant.client.post(`${path()}/units`, collisionWarningUnit({ radioId: '3d2f1a' }))
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ kind: 'collision-warning', radioId: '3D2F1A', firmwareExpiresOn: '2027-10-31', approvalLevel: null })
    unitId = res.body.id
    expect((await auditRows(unitId, 'unit.added')).length).toBe(1)
  })

  it('answers 400 with field messages for a bad unit', async () => {
    const res = await w.entrant.client.post(`${path()}/units`, collisionWarningUnit({ radioId: 'XYZ', firmwareExpiresOn: '2027-02-30' }))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.radioId).toEqual(['A radio ID is six hexadecimal digits, e.g. 3D2F1A.'])
    expect(res.body.data.fieldErrors.firmwareExpiresOn).toEqual(['That date does not exist.'])
    const kind = await w.entrant.client.post(`${path()}/units`, { kind: 'toaster' })
    expect(kind.status).toBe(400)
  })

  it('answers 409 naming the other entry when its radio ID is already in use', async () => {
    const other = (await w.otherEntrant.client.get('/api/me/entries')).body.entries.find((e: { competitionId: string, status: string }) => e.competitionId === w.competitionId && e.status !== 'withdrawn')
    const res = await w.otherEntrant.client.post(`/api/competitions/${w.competitionId}/entries/${other.id}/units`, collisionWarningUnit({ radioId: '3D2F1A', serial: 'CW-9' }))
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('Radio ID 3D2F1A is already used by entry KT — Erin Entrant (G-KTST).')
    expect(res.body.data.field).toBe('radioId')
    const same = await w.entrant.client.post(`${path()}/units`, collisionWarningUnit({ radioId: '3d2f1a', serial: 'CW-2' }))
    expect(same.status).toBe(409)
    expect(same.body.message).toBe('Radio ID 3D2F1A is already used by another unit of this entry.')
  })

  it('changes a unit field by field in the audit log, keeps its own radio ID, refuses a change of kind', async () => {
    const res = await w.entrant.client.request('PATCH', `${path()}/units/${unitId}`, collisionWarningUnit({ radioId: '3D2F1A', firmwareVersion: '7.22', firmwareExpiresOn: '2028-03-31' }))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ firmwareVersion: '7.22', firmwareExpiresOn: '2028-03-31' })
    const rows = await auditRows(unitId, 'unit.updated')
    expect(rows.map(r => [r.details.field, r.details.from, r.details.to])).toEqual([
      ['firmwareVersion', '7.20', '7.22'],
      ['firmwareExpiresOn', '2027-10-31', '2028-03-31'],
    ])
    const kind = await w.entrant.client.request('PATCH', `${path()}/units/${unitId}`, flightRecorderUnit())
    expect(kind.status).toBe(400)
    expect(kind.body.message).toBe('A unit cannot change its kind: delete it and add the other kind instead.')
  })

  it('hides units from other entrants (404) and answers 404 for a unit of another entry', async () => {
    expect((await w.otherEntrant.client.request('DELETE', `${path()}/units/${unitId}`)).status).toBe(404)
    expect((await w.entrant.client.request('DELETE', `${path()}/units/00000000-0000-4000-8000-000000000000`)).status).toBe(404)
    expect((await w.anonymous.request('DELETE', `${path()}/units/${unitId}`)).status).toBe(401)
  })

  it('deletes a unit and keeps what it was in the audit log', async () => {
    const extra = await w.entrant.client.post(`${path()}/units`, flightRecorderUnit({ serial: 'FR-DEL' }))
    const res = await w.entrant.client.request('DELETE', `${path()}/units/${extra.body.id}`)
    expect(res.status).toBe(204)
    expect(await testDb()('units').where({ id: extra.body.id }).first()).toBeUndefined()
    const [row] = await auditRows(extra.body.id, 'unit.deleted')
    expect(row.details).toMatchObject({ serial: 'FR-DEL', kind: 'flight-recorder' })
  })
})

describe('submitting', () => {
  it('refuses with 400 listing what is missing', async () => {
    const res = await w.entrant.client.post(`${path()}/submit`)
    expect(res.status).toBe(400)
    expect(res.body.data.missing).toEqual(['Add a flight recorder.'])
    expect(res.body.message).toBe('The entry cannot be submitted yet: Add a flight recorder.')
    expect((await testDb()('entries').where({ id: entryId }).first()).status).toBe('draft')
  })

  it('asks for two recorders where the competition requires two, and for missing fields', async () => {
    const competitionId = await createCompetition('Two Recorder Cup')
    await testDb()('competitions').where({ id: competitionId }).update({ settings: { recordersRequired: 2 } })
    const cls = await createClass(competitionId)
    const id = await createEntryVia(w.entrant.client, competitionId, entryBody(cls, { pilotPhone: undefined }))
    await w.entrant.client.post(`/api/competitions/${competitionId}/entries/${id}/units`, flightRecorderUnit())
    const res = await w.entrant.client.post(`/api/competitions/${competitionId}/entries/${id}/submit`)
    expect(res.status).toBe(400)
    expect(res.body.data.missing).toEqual([
      'Enter the pilot’s phone number.',
      'Add the collision-warning unit.',
      'Add one more flight recorder: this competition requires 2.',
    ])
  })

  it('submits a complete entry and queues e-mails to the entrant and the organiser', async () => {
    await w.entrant.client.post(`${path()}/units`, flightRecorderUnit())
    const scrutineer = await w.scrutineer.client.post(`${path()}/submit`)
    expect(scrutineer.status).toBe(403)
    const res = await w.entrant.client.post(`${path()}/submit`)
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('submitted')
    expect(res.body.entry.submittedAt).toBeTruthy()
    const mails = await mailRows(entryId)
    expect(mails.map(m => [m.template, m.to_address])).toEqual([
      ['entry-submitted', w.entrant.email],
      ['entry-submitted', w.organiser.email],
    ])
    expect(mails[0].subject).toBe('Entry KT submitted — Entries Cup')
    // Each links to the entry's page: the entrant's to act on it, the organiser's to decide.
    const page = `${baseUrl}/competitions/${w.competitionId}/entries/${entryId}`
    expect(mails[0].text_body).toContain(`Open your entry:\n${page}`)
    expect(mails[0].html_body).toContain(`href="${page}"`)
    expect(mails[1].subject).toBe('New entry to review: KT — Entries Cup')
    expect(mails[1].text_body).toContain(`Review the entry:\n${page}`)
    expect(mails[1].text_body).toContain('reject it with a reason')
    expect((await auditRows(entryId, 'entry.submitted')).length).toBe(1)
    const again = await w.entrant.client.post(`${path()}/submit`)
    expect(again.status).toBe(409)
  })
})

describe('deciding', () => {
  it('refuses the scrutineer and the entrant (403)', async () => {
    const s = await w.scrutineer.client.post(`${path()}/accept`)
    expect(s.status).toBe(403)
    expect(s.body.message).toBe('This needs the organiser role in this competition.')
    expect((await w.entrant.client.post(`${path()}/accept`)).status).toBe(403)
    expect((await w.outsider.client.post(`${path()}/accept`)).status).toBe(404)
    expect((await w.anonymous.post(`${path()}/accept`)).status).toBe(401)
  })

  it('needs a reason to reject (400)', async () => {
    const res = await w.organiser.client.post(`${path()}/reject`, { reason: ' ' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.reason).toEqual(['Give the entrant a reason.'])
  })

  it('rejects with a reason, e-mails it, and the entrant can submit again', async () => {
    const res = await w.organiser.client.post(`${path()}/reject`, { reason: 'The MTOM does not match the flight manual.' })
    expect(res.status).toBe(200)
    expect(res.body.entry).toMatchObject({ status: 'rejected', decisionReason: 'The MTOM does not match the flight manual.' })
    const mail = (await mailRows(entryId)).find(m => m.template === 'entry-rejected')
    expect(mail.to_address).toBe(w.entrant.email)
    expect(mail.text_body).toContain('The MTOM does not match the flight manual.')
    expect(mail.text_body).toContain(`Change and resubmit your entry:\n${baseUrl}/competitions/${w.competitionId}/entries/${entryId}`)
    const [row] = await auditRows(entryId, 'entry.rejected')
    expect(row.details).toMatchObject({ reason: 'The MTOM does not match the flight manual.', to: 'rejected' })

    const me = await w.entrant.client.get(path())
    expect(me.body.progress.nextStep).toContain('The MTOM does not match the flight manual.')
    expect((await w.entrant.client.post(`${path()}/submit`)).status).toBe(200)
  })

  it('accepts a submitted entry and e-mails the entrant; the entrant may then no longer change it', async () => {
    const res = await w.organiser.client.post(`${path()}/accept`)
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('accepted')
    expect(res.body.entry.decisionReason).toBeNull()
    const mail = (await mailRows(entryId)).find(m => m.template === 'entry-accepted')
    expect(mail.to_address).toBe(w.entrant.email)
    expect(mail.text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${w.competitionId}/entries/${entryId}`)
    // Only what is open is listed, each with its rule; what is done (here the fee, when paid) is not.
    const paid = (await testDb()('entries').where({ id: entryId }).first()).payment_status === 'paid'
    expect(mail.text_body.includes('of the entry fee is still to pay')).toBe(!paid)
    expect(mail.text_body).not.toContain('make sure')
    expect((await w.organiser.client.post(`${path()}/accept`)).status).toBe(409)
    // Accepted: the entrant keeps contact data current, but the competition ID is the office's.
    expect((await w.entrant.client.request('PATCH', path(), { pilotPhone: '+44 7700 900222' })).status).toBe(200)
    const patch = await w.entrant.client.request('PATCH', path(), { compId: 'KZ' })
    expect(patch.status).toBe(403)
    expect(patch.body.message).toBe('The entry is accepted: only the office changes its competition ID now. Ask them with a message from the entry page.')
  })
})

describe('my entries', () => {
  it('lists the caller’s entries with what is missing and the next step', async () => {
    const res = await w.entrant.client.get('/api/me/entries')
    expect(res.status).toBe(200)
    const mine = res.body.entries.find((e: { id: string }) => e.id === entryId)
    expect(mine).toMatchObject({ competitionName: 'Entries Cup', className: 'Standard', compId: 'KT', status: 'accepted', paymentStatus: 'unpaid' })
    expect(mine.missing).toContain('Pay the entry fee.')
    expect(mine.missing).toContain('Upload the airworthiness review.')
    // Its findings are the pilot's next step (the first one to put right), not "complete".
    expect(mine.nextStep).toMatch(/^The entry is accepted, but \d+ findings keep the glider from flying\. Put right first: /)
    expect(res.body.entries.every((e: { id: string }) => e.id !== undefined)).toBe(true)
    expect((await w.otherEntrant.client.get('/api/me/entries')).body.entries.some((e: { id: string }) => e.id === entryId)).toBe(false)
  })

  it('answers 401 when not signed in', async () => {
    expect((await w.anonymous.get('/api/me/entries')).status).toBe(401)
  })
})

describe('withdrawing', () => {
  it('is for the entrant (the organiser needs a reason); it frees the competition ID and its radio IDs', async () => {
    const organiser = await w.organiser.client.post(`${path()}/withdraw`)
    expect(organiser.status).toBe(400)
    expect(organiser.body.message).toBe('Say why the office withdraws this entry: the pilot is told the reason.')
    const scrutineer = await w.scrutineer.client.post(`${path()}/withdraw`, { reason: 'Not theirs' })
    expect(scrutineer.status).toBe(403)
    const res = await w.entrant.client.post(`${path()}/withdraw`)
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('withdrawn')
    expect(res.body.can).toMatchObject({ edit: false, withdraw: false })
    expect((await w.entrant.client.post(`${path()}/withdraw`)).status).toBe(409)
    expect((await auditRows(entryId, 'entry.withdrawn')).length).toBe(1)

    const id = await completeEntry(w.outsider.client, w.competitionId, entryBody(w.classId, { compId: 'KT', pilotName: 'Nora Nonmember', registration: 'G-NORA' }), '3D2F1A')
    expect(id).toBeTruthy()
  })
})

describe('firmware suggestion', () => {
  beforeAll(async () => {
    await testDb()('firmware_releases').insert([
      { competition_id: w.competitionId, unit_family: 'CW-2', version: '7.22', expires_on: '2028-03-31' },
      { competition_id: w.competitionId, unit_family: 'CW', version: '7.22', expires_on: '2027-01-31' },
    ])
  })

  it('offers the catalogue’s expiry for a model containing the family, longest family first', async () => {
    const res = await w.entrant.client.get(`/api/competitions/${w.competitionId}/firmware/suggest?family=${encodeURIComponent('Example cw-2 Pro')}&version=7.22`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ expiresOn: '2028-03-31', unitFamily: 'CW-2', version: '7.22' })
  })

  it('answers null for a version the catalogue does not know', async () => {
    const res = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/firmware/suggest?family=CW-2&version=9.99`)
    expect(res.body).toEqual({ expiresOn: null, unitFamily: null, version: null })
  })

  it('answers 400 without a version, 404 to a non-member, 401 when signed out', async () => {
    const bad = await w.entrant.client.get(`/api/competitions/${w.competitionId}/firmware/suggest?family=CW-2`)
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.version).toEqual(['Give the firmware version.'])
    const outsider = await new ApiClient(baseUrl).get(`/api/competitions/${w.competitionId}/firmware/suggest?family=CW-2&version=7.22`)
    expect(outsider.status).toBe(401)
    const s = await signedUpClient(baseUrl, 'Stranger')
    expect((await s.client.get(`/api/competitions/${w.competitionId}/firmware/suggest?family=CW-2&version=7.22`)).status).toBe(404)
  })
})

describe('races and site administrators', () => {
  it('lets only one of two simultaneous units take the same radio ID', async () => {
    const competitionId = await createCompetition('Race Cup')
    const cls = await createClass(competitionId)
    const a = await createEntryVia(w.entrant.client, competitionId, entryBody(cls, { compId: 'A1' }))
    const b = await createEntryVia(w.otherEntrant.client, competitionId, entryBody(cls, { compId: 'B1', registration: 'G-BBBB' }))
    const [ra, rb] = await Promise.all([
      w.entrant.client.post(`/api/competitions/${competitionId}/entries/${a}/units`, collisionWarningUnit({ radioId: 'ABC123' })),
      w.otherEntrant.client.post(`/api/competitions/${competitionId}/entries/${b}/units`, collisionWarningUnit({ radioId: 'abc123' })),
    ])
    expect([ra.status, rb.status].sort()).toEqual([201, 409])
    expect((await testDb()('units').where({ competition_id: competitionId, radio_id: 'ABC123' })).length).toBe(1)
  })

  it('gives a site administrator the organiser’s decision without membership', async () => {
    const competitionId = await createCompetition('Admin Cup')
    const cls = await createClass(competitionId)
    const id = await completeEntry(w.entrant.client, competitionId, entryBody(cls, { compId: 'AD' }), 'ADAD01')
    expect((await w.entrant.client.post(`/api/competitions/${competitionId}/entries/${id}/submit`)).status).toBe(200)
    const a = await signedUpClient(baseUrl, 'Ada Admin')
    await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
    const res = await a.client.post(`/api/competitions/${competitionId}/entries/${id}/accept`)
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('accepted')
  })
})
