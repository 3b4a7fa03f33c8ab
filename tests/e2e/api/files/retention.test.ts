/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The retention schedule of documents' stored files, run through the job's admin route at
// chosen instants (the controllable clock): medical and licence files go the organiser's
// number of days after the last contest day (from 00:00 in the competition's time zone on day
// last + N + 1), replaced copies of any kind 30 × 24 h after a newer copy was accepted (a
// pending or rejected one starts no clock); each row keeps its metadata, is audited, shows in
// the pilot's timeline, and a second run (or two at once) deletes nothing more.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { getBytes, postForm, storedFileCount, tinyPdf, tinyPng } from '../../../support/files'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

// Long before any other test's dates, so that no run here reaches another test's files.
const LAST_CONTEST_DAY = '2015-07-10'
/** The scrutineers accepted the newer copies then: replaced copies are due 30 days later. */
const ACCEPTED_AT = '2015-06-20T10:00:00.000Z'
const SUPERSEDED_DUE = '2015-07-20T10:00:00.000Z'
/** Kept 10 days (2015-07-11 to 2015-07-20): due from 2015-07-21 00:00 in Berlin (UTC+2). */
const MEDICAL_DUE = '2015-07-20T22:00:00.000Z'
const KEPT_ON_RECORD = 'its kind, validity and review outcome stay on record'

let admin: ApiClient
let organiser: ApiClient
let scrutineer: ApiClient
let pilot: ApiClient
let competitionId: string
let entryA: string
let entryB: string
/** Every document by name: M1 → M2 medical, L1 licence, A1 → A2 airworthiness, I1 → I2 insurance (A); B1 → B2 → B3 airworthiness, J1 → J2 insurance, MB medical (B). */
const doc: Record<string, { id: string, entryId: string, sha256: string, expiresOn: string }> = {}

const run = (at?: string, client = admin) => client.post('/api/admin/retention/run', at === undefined ? {} : { at })
const fileOf = (name: string) => `/api/competitions/${competitionId}/entries/${doc[name]!.entryId}/documents/${doc[name]!.id}/file`
const rowOf = (name: string) => testDb()('documents').where({ id: doc[name]!.id }).first()

async function upload(name: string, entryId: string, kind: string, expiresOn: string, client = pilot) {
  const res = await postForm(client, `/api/competitions/${competitionId}/entries/${entryId}/documents`, { kind, expiresOn },
    name.startsWith('I') || name.startsWith('J') ? { name: `${name}.png`, data: tinyPng() } : { name: `${name}.pdf`, data: tinyPdf(name) })
  expect(res.status).toBe(201)
  doc[name] = { id: res.body.document.id, entryId, sha256: res.body.document.sha256, expiresOn }
}

async function review(name: string, decision: 'accept' | 'reject') {
  const body = decision === 'accept' ? { decision } : { decision, reason: 'The scan is unreadable.' }
  const res = await scrutineer.post(`/api/competitions/${competitionId}/documents/${doc[name]!.id}/review`, body)
  expect(res.status).toBe(200)
}

async function deletedNow(): Promise<string[]> {
  const ids = Object.values(doc).map(d => d.id)
  const rows = await testDb()('documents').whereIn('id', ids).whereNotNull('file_deleted_at').select('id')
  const names = Object.entries(doc).filter(([, d]) => rows.some(r => r.id === d.id)).map(([n]) => n)
  return names.sort()
}

beforeAll(async () => {
  const [a, o, s, p, p2] = await Promise.all([
    signedUpClient(baseUrl, 'Rhea Admin'),
    signedUpClient(baseUrl, 'Orla Organiser'),
    signedUpClient(baseUrl, 'Sven Scrutineer'),
    signedUpClient(baseUrl, 'Pia Pilot'),
    signedUpClient(baseUrl, 'Quinn Pilot'),
  ])
  await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
  admin = a.client
  organiser = o.client
  scrutineer = s.client
  pilot = p.client
  competitionId = await createCompetition('Retention Cup', [
    { userId: o.user.id, role: 'organiser' },
    { userId: s.user.id, role: 'scrutineer' },
    { userId: p.user.id, role: 'entrant' },
    { userId: p2.user.id, role: 'entrant' },
  ])
  const classId = await createClass(competitionId)
  entryA = await createEntry({ competitionId, classId, entrantUserId: p.user.id, status: 'submitted', compId: 'RT1' })
  entryB = await createEntry({ competitionId, classId, entrantUserId: p2.user.id, status: 'submitted', compId: 'RT2' })

  // The organiser keeps medical and licence files 10 days (the form's rule; 30 by default).
  const rules = await organiser.request('PATCH', `/api/competitions/${competitionId}`, { rules: { medicalRetentionDays: 10 } })
  expect(rules.status).toBe(200)
  expect(rules.body.rules.medicalRetentionDays).toBe(10)

  // Entry A: a medical and an airworthiness review replaced by accepted copies, an insurance
  // replaced by a copy still pending, a licence never replaced.
  await upload('M1', entryA, 'medical', '2016-01-31')
  await review('M1', 'accept')
  await upload('M2', entryA, 'medical', '2017-01-31')
  await review('M2', 'accept')
  await upload('L1', entryA, 'licence', '2019-12-31')
  await upload('A1', entryA, 'airworthiness', '2015-09-30')
  await review('A1', 'accept')
  await upload('A2', entryA, 'airworthiness', '2016-09-30')
  await review('A2', 'accept')
  await upload('I1', entryA, 'insurance', '2015-12-31')
  await review('I1', 'accept')
  await upload('I2', entryA, 'insurance', '2016-12-31')
  // Entry B (uploaded by the office): an airworthiness review whose first replacement was
  // rejected and the second accepted; an insurance replaced by a rejected copy; a medical.
  await upload('B1', entryB, 'airworthiness', '2015-08-31', organiser)
  await upload('B2', entryB, 'airworthiness', '2016-08-31', organiser)
  await review('B2', 'reject')
  await upload('B3', entryB, 'airworthiness', '2016-08-31', organiser)
  await review('B3', 'accept')
  await upload('J1', entryB, 'insurance', '2015-12-31', organiser)
  await upload('J2', entryB, 'insurance', '2016-12-31', organiser)
  await review('J2', 'reject')
  await upload('MB', entryB, 'medical', '2016-03-31', organiser)

  // The competition took place in 2015, and its reviews were made before it.
  await testDb()('competitions').where({ id: competitionId }).update({ first_contest_day: '2015-07-01', last_contest_day: LAST_CONTEST_DAY })
  await testDb()('documents').where({ competition_id: competitionId }).whereNotNull('reviewed_at').update({ reviewed_at: ACCEPTED_AT })
})

describe('POST /api/admin/retention/run', () => {
  it('is for site administrators: 401 signed out, 403 for the competition’s organiser, 400 on a bad instant', async () => {
    expect((await run(undefined, new ApiClient(baseUrl))).status).toBe(401)
    const organisers = await run('2015-07-19T12:00:00Z', organiser)
    expect(organisers.status).toBe(403)
    expect(organisers.body.message).toBe('Only a site administrator can do this.')
    const bad = await run('the day after the competition')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.at).toEqual(['Give the time as an ISO date-time, e.g. 2027-08-18T00:00:00Z.'])
    expect((await admin.post('/api/admin/retention/run', { at: '2015-07-19T12:00:00Z', dryRun: true })).status).toBe(400)
    expect(await deletedNow()).toEqual([])
  })

  it('deletes nothing the day before anything is due, nor in the last second before replaced copies are', async () => {
    expect((await run('2015-07-19T12:00:00Z')).body).toEqual({ medicalDeleted: 0, supersededDeleted: 0 })
    expect((await run('2015-07-20T09:59:59Z')).body).toEqual({ medicalDeleted: 0, supersededDeleted: 0 })
    expect(await deletedNow()).toEqual([])
    expect(storedFileCount('documents', entryA)).toBe(7)
    expect(storedFileCount('documents', entryB)).toBe(6)
  })

  it('deletes the replaced copies 30 days after a newer copy was accepted, at that instant', async () => {
    const res = await run(SUPERSEDED_DUE)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ medicalDeleted: 0, supersededDeleted: 4 })
    // I1's replacement is pending and J1's was rejected: their clocks have not started. B1 and
    // B2 go with B3, accepted after B2 was rejected.
    expect(await deletedNow()).toEqual(['A1', 'B1', 'B2', 'M1'])
    expect(storedFileCount('documents', entryA)).toBe(5)
    expect(storedFileCount('documents', entryB)).toBe(4)
    const gone = await getBytes(pilot, fileOf('A1'))
    expect(gone.status).toBe(410)
    expect(JSON.parse(gone.data.toString()).message).toMatch(/^This file is no longer kept: it was deleted on the competition’s retention schedule\./)
    for (const kept of ['A2', 'I1', 'I2', 'M2', 'L1']) expect((await getBytes(pilot, fileOf(kept))).status).toBe(200)
    // The pilot's openings of the medical and licence files are recorded with the address.
    const openings = await testDb()('document_views').whereIn('document_id', [doc.M2!.id, doc.L1!.id])
    expect(openings).toHaveLength(2)
    expect(openings.every(v => v.client_address === pilot.address)).toBe(true)
    expect((await rowOf('M1')).file_deleted_reason).toBe('retention-superseded')
  })

  it('keeps medical and licence files until midnight in the competition’s time zone, 10 days after its last day', async () => {
    expect((await run('2015-07-20T21:59:59Z')).body).toEqual({ medicalDeleted: 0, supersededDeleted: 0 })
    expect((await getBytes(pilot, fileOf('M2'))).status).toBe(200)
  })

  it('deletes every medical and licence file then, once, however many runs go at the same instant', async () => {
    const both = await Promise.all([run(MEDICAL_DUE), run(MEDICAL_DUE)])
    expect(both.map(r => r.status)).toEqual([200, 200])
    expect(both[0]!.body.medicalDeleted + both[1]!.body.medicalDeleted).toBe(3)
    expect(both[0]!.body.supersededDeleted + both[1]!.body.supersededDeleted).toBe(0)
    expect(await deletedNow()).toEqual(['A1', 'B1', 'B2', 'L1', 'M1', 'M2', 'MB'])
    // Left: the current airworthiness reviews and insurances, and the copies whose clock has not started.
    expect(storedFileCount('documents', entryA)).toBe(3)
    expect(storedFileCount('documents', entryB)).toBe(3)
    for (const gone of ['M2', 'L1', 'MB']) expect((await getBytes(organiser, fileOf(gone))).status).toBe(410)
    // Who opened them and when stays on record; from where goes with the files.
    const openings = await testDb()('document_views').whereIn('document_id', [doc.M2!.id, doc.L1!.id])
    expect(openings.length).toBeGreaterThanOrEqual(2)
    expect(openings.map(v => v.client_address)).toEqual(openings.map(() => ''))
    for (const kept of ['A2', 'I1', 'I2', 'B3', 'J1', 'J2']) expect((await getBytes(organiser, fileOf(kept))).status).toBe(200)
  })

  it('deletes nothing more on a later run', async () => {
    expect((await run('2015-09-01T00:00:00Z')).body).toEqual({ medicalDeleted: 0, supersededDeleted: 0 })
    expect(await deletedNow()).toEqual(['A1', 'B1', 'B2', 'L1', 'M1', 'M2', 'MB'])
    expect(storedFileCount('documents', entryA)).toBe(3)
    expect(storedFileCount('documents', entryB)).toBe(3)
  })
})

describe('what stays of a deleted file', () => {
  it('keeps the row: kind, validity, review outcome, sha256, and when and why the file went; no file name or key', async () => {
    const row = await rowOf('M2')
    expect(row).toMatchObject({
      kind: 'medical', expires_on: doc.M2!.expiresOn, status: 'accepted', sha256: doc.M2!.sha256,
      storage_key: null, original_filename: '', file_deleted_reason: 'retention-medical', file_kept_days: 10,
    })
    expect(row.file_deleted_at).toBeInstanceOf(Date)
  })

  it('lists the document with its metadata and "deleted on … (kept N days after the competition)" instead of a link', async () => {
    const res = await pilot.get(`/api/competitions/${competitionId}/entries/${entryA}/documents`)
    expect(res.status).toBe(200)
    const today = new Intl.DateTimeFormat('en-CA', { timeZone: 'Europe/Berlin' }).format(new Date())
    const medical = res.body.current.find((d: any) => d.kind === 'medical')
    expect(medical).toMatchObject({
      id: doc.M2!.id, expiresOn: doc.M2!.expiresOn, status: 'accepted', sha256: doc.M2!.sha256,
      fileDeleted: { on: today, reason: 'retention-medical', keptDays: 10, note: `Deleted on ${today} (kept 10 days after the competition)` },
    })
    const airworthiness = res.body.current.find((d: any) => d.kind === 'airworthiness')
    expect(airworthiness).toMatchObject({ id: doc.A2!.id, fileDeleted: null })
    const replaced = res.body.history.find((d: any) => d.id === doc.A1!.id)
    expect(replaced.fileDeleted).toMatchObject({ reason: 'retention-superseded', keptDays: 30, note: `Deleted on ${today} (kept 30 days after a newer copy was accepted)` })
    expect(res.body.history.find((d: any) => d.id === doc.I1!.id).fileDeleted).toBeNull()
  })

  it('writes one audit row per deleted file, by no one, with ids, kind and reason only', async () => {
    const rows = await testDb()('audit_log').where({ competition_id: competitionId, action: 'document.file-deleted' }).orderBy('id')
    expect(rows).toHaveLength(7)
    const byDocument = Object.fromEntries(rows.map(r => [r.subject_id, r]))
    expect(byDocument[doc.MB!.id]).toMatchObject({
      actor_user_id: null, subject_type: 'document',
      details: { entryId: entryB, kind: 'medical', reason: 'retention-medical', keptDays: 10 },
    })
    expect(byDocument[doc.B1!.id].details).toEqual({ entryId: entryB, kind: 'airworthiness', reason: 'retention-superseded', keptDays: 30 })
  })

  it('tells the pilot in the entry’s timeline', async () => {
    const res = await pilot.get(`/api/competitions/${competitionId}/entries/${entryA}/timeline`)
    expect(res.status).toBe(200)
    const items = res.body.items.filter((i: any) => i.kind === 'document')
    expect(items.map((i: any) => i.summary).sort()).toEqual([
      `Earlier airworthiness review file deleted, kept 30 days after a newer copy was accepted; ${KEPT_ON_RECORD}`,
      `Earlier medical file deleted, kept 30 days after a newer copy was accepted; ${KEPT_ON_RECORD}`,
      `Medical file deleted, kept 10 days after the competition; ${KEPT_ON_RECORD}`,
      `Pilot licence file deleted, kept 10 days after the competition; ${KEPT_ON_RECORD}`,
    ])
    expect(items.every((i: any) => i.actor === null)).toBe(true)
  })
})
