/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The pre-event reminders on the organiser's schedule, run through the job's admin route at
// chosen instants (the controllable clock) and read back from the SMTP capture: each reminder
// of the schedule once to each entry with open findings, "finish your entry" to drafts, nothing
// to an entry with nothing open, a withdrawn or a rejected entry; only the latest reminder due
// after days without a run.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let admin: ApiClient
let organiser: ApiClient
let director: ApiClient
let entrant: ApiClient
let competitionId: string
// Each entrant's own address, so what the capture holds for one is about their entries alone.
let entrantEmail: string // RM1 (submitted) and RM2 (accepted), both with open findings
let drafterEmail: string // RM3, a draft
let settledEmail: string // RM5, accepted, every finding waived by the director
let goneEmail: string // RM6 rejected and RM7 withdrawn, both with open findings
let submitted: string
let accepted: string
let draft: string
let settled: string
let rejected: string
let withdrawn: string

// Far in the future, so no other test's run of the job reaches it by accident.
const FIRST_DAY = '2031-06-10'

const run = (now: string, client = admin) => client.post('/api/admin/reminders/run', { now })
const ours = () => [submitted, accepted, draft, settled, rejected, withdrawn]
const kindsOf = (res: { body: { reminders: { entryId: string, kind: string }[] } }) =>
  Object.fromEntries(res.body.reminders.filter(r => ours().includes(r.entryId)).map(r => [r.entryId, r.kind]))
const reminderRows = (ids: string[]) => testDb()('mail_reminders').whereIn('entry_id', ids).orderBy('kind')

beforeAll(async () => {
  const [a, o, d, e, dr, st, g] = await Promise.all([
    signedUpClient(baseUrl, 'Ada Admin'),
    signedUpClient(baseUrl, 'Olga Organiser'),
    signedUpClient(baseUrl, 'Dora Director'),
    signedUpClient(baseUrl, 'Ezra Entrant'),
    signedUpClient(baseUrl, 'Dana Drafter'),
    signedUpClient(baseUrl, 'Sid Settled'),
    signedUpClient(baseUrl, 'Gus Gone'),
  ])
  await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
  admin = a.client
  organiser = o.client
  director = d.client
  entrant = e.client
  entrantEmail = e.email
  drafterEmail = dr.email
  settledEmail = st.email
  goneEmail = g.email
  competitionId = await createCompetition('Reminder Cup', [
    { userId: o.user.id, role: 'organiser' },
    { userId: d.user.id, role: 'director' },
    ...[e, dr, st, g].map(x => ({ userId: x.user.id, role: 'entrant' })),
  ])
  await testDb()('competitions').where({ id: competitionId }).update({ first_contest_day: FIRST_DAY, last_contest_day: '2031-06-20' })
  const classId = await createClass(competitionId)
  submitted = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: 'submitted', compId: 'RM1' })
  accepted = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: 'accepted', compId: 'RM2' })
  draft = await createEntry({ competitionId, classId, entrantUserId: dr.user.id, status: 'draft', compId: 'RM3' })
  settled = await createEntry({ competitionId, classId, entrantUserId: st.user.id, status: 'accepted', compId: 'RM5' })
  rejected = await createEntry({ competitionId, classId, entrantUserId: g.user.id, status: 'rejected', compId: 'RM6' })
  withdrawn = await createEntry({ competitionId, classId, entrantUserId: g.user.id, status: 'withdrawn', compId: 'RM7' })
  // RM2's pilot has paid: their reminder says nothing of the fee.
  await testDb()('entries').where({ id: accepted }).update({ payment_status: 'paid' })
  await testDb()('units').insert([
    { entry_id: accepted, competition_id: competitionId, kind: 'collision-warning', model: 'CW-1', serial: 'CW100', radio_id: 'ABC123', firmware_expires_on: '2031-06-15' },
    { entry_id: accepted, competition_id: competitionId, kind: 'flight-recorder', model: 'FR-2', serial: 'FR200', approval_level: 'all-flights' },
    // The draft has its collision-warning unit, but no flight recorder yet.
    { entry_id: draft, competition_id: competitionId, kind: 'collision-warning', model: 'CW-1', serial: 'CW300', radio_id: 'ABC124', firmware_expires_on: '2032-06-15' },
  ])
})

describe('the reminder schedule in the set-up', () => {
  it('is 30, 14 and 3 days before by default; the organiser sets it, audited', async () => {
    const before = await organiser.get(`/api/competitions/${competitionId}/setup`)
    expect(before.body.reminderDays).toEqual([30, 14, 3])
    const res = await organiser.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [3, 30, 14, 7] })
    expect(res.status).toBe(200)
    expect(res.body.reminderDays).toEqual([30, 14, 7, 3])
    const stored = await testDb()('competitions').where({ id: competitionId }).first()
    expect(stored.settings.reminderDays).toEqual([30, 14, 7, 3])
    const log = await testDb()('audit_log').where({ subject_id: competitionId, action: 'competition.setup-changed' }).orderBy('id', 'desc').first()
    expect(log.details.changes.reminderDays).toEqual({ from: [30, 14, 3], to: [30, 14, 7, 3] })
    // Back to the default schedule for the runs below.
    expect((await organiser.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [30, 14, 3] })).body.reminderDays).toEqual([30, 14, 3])
  })

  it('refuses a schedule that cannot be, with a reason beside the field; entrants cannot set it', async () => {
    const zero = await organiser.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [0, 14] })
    expect(zero.status).toBe(400)
    expect(zero.body.data.fieldErrors.reminderDays).toEqual(['A reminder goes at least 1 day before the first contest day.'])
    const twice = await organiser.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [14, 14] })
    expect(twice.body.data.fieldErrors.reminderDays).toEqual(['A reminder day is listed twice.'])
    const many = await organiser.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [1, 2, 3, 4, 5, 6, 7] })
    expect(many.body.data.fieldErrors.reminderDays).toEqual(['Schedule at most 6 reminders.'])
    expect((await organiser.get(`/api/competitions/${competitionId}/setup`)).body.reminderDays).toEqual([30, 14, 3])
    const refused = await entrant.request('PATCH', `/api/competitions/${competitionId}`, { reminderDays: [1] })
    expect(refused.status).toBe(403)
  })
})

describe('POST /api/admin/reminders/run', () => {
  it('refuses everyone but site administrators, and bad bodies', async () => {
    expect((await new ApiClient(baseUrl).post('/api/admin/reminders/run', {})).status).toBe(401)
    const forbidden = await organiser.post('/api/admin/reminders/run', {})
    expect(forbidden.status).toBe(403)
    expect(forbidden.body.message).toBe('Only a site administrator can do this.')
    const bad = await admin.post('/api/admin/reminders/run', { now: 'next tuesday' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.now[0]).toContain('ISO date-time')
  })

  it('the director waives every finding of RM5 for the whole competition: nothing is open on it', async () => {
    const findings = (await director.get(`/api/competitions/${competitionId}/entries/${settled}/findings`)).body.findings as any[]
    expect(findings.length).toBeGreaterThan(0)
    for (const f of findings) {
      const res = await director.post(`/api/competitions/${competitionId}/entries/${settled}/waivers`, {
        scope: 'competition', checkId: f.checkId, ...(f.unitId ? { unitId: f.unitId } : {}), ...(f.subject ? { subject: f.subject } : {}), reason: 'Settled with the office before the event',
      })
      expect(res.status).toBe(201)
    }
  })

  it('sends nothing 31 days before (in the competition’s time zone)', async () => {
    const res = await run('2031-05-10T12:00:00Z') // 10 May in Berlin: 31 days before
    expect(res.status).toBe(200)
    expect(kindsOf(res)).toEqual({})
    expect(await reminderRows(ours())).toHaveLength(0)
  })

  it('30 days before: the 30-day reminder to each entry with open findings, and "finish your entry" to the draft', async () => {
    const res = await run('2031-05-10T22:30:00Z') // already 11 May in Berlin: 30 days before
    expect(res.status).toBe(200)
    expect(kindsOf(res)).toEqual({ [submitted]: 'pre-event-30', [accepted]: 'pre-event-30', [draft]: 'draft-30' })

    const messages = await waitForMail(entrantEmail, { count: 2 })
    expect(messages).toHaveLength(2)
    for (const m of messages) {
      expect(m.to).toEqual([entrantEmail])
      expect(m.subject).toBe('Reminder: Reminder Cup starts on 10 June 2031')
      expect(m.text).toContain('Reminder Cup starts on 10 June 2031 (in 30 days).')
    }
    const forSubmitted = messages.find(m => m.text.includes('RM1'))!
    // The check engine's findings, each with its fix hint.
    expect(forSubmitted.text).toContain('Blocking: No flight recorder is declared; the competition requires 1 recorder.')
    expect(forSubmitted.text).toContain('The organiser has not accepted your entry yet.')
    expect(forSubmitted.links).toContain(`${baseUrl}/competitions/${competitionId}/entries/${submitted}`)
    const forAccepted = messages.find(m => m.text.includes('RM2'))!
    // firmware.valid-through-contest, with its fix hint and the hardware caution.
    expect(forAccepted.text).toContain('expires 2031-06-15, the last contest day is 2031-06-20')
    expect(forAccepted.text).toContain('Update the unit to a firmware release that expires after 2031-06-20')
    expect(forAccepted.text).toContain('Caution: Power the unit off before inserting or removing update media')
    // Each finding links to its rule on the competition's rulebook page.
    expect(forAccepted.links).toContain(`${baseUrl}/competitions/${competitionId}/checks#firmware.valid-through-contest`)
    expect(forSubmitted.links).toContain(`${baseUrl}/competitions/${competitionId}/checks#recorder.present`)
    expect(forAccepted.text).not.toContain('No flight recorder')
    // Only what is actually missing: the unpaid entry is told of its fee, the paid one is not.
    expect(forSubmitted.text).toContain('€300.00 of the entry fee is still to pay')
    expect(forAccepted.text).not.toMatch(/entry fee/i)

    // The draft: what submitting still needs (its unit is there, its recorder is not).
    const [toDrafter] = await waitForMail(drafterEmail)
    expect(toDrafter!.subject).toBe('Finish your entry: Reminder Cup starts on 10 June 2031')
    expect(toDrafter!.text).toContain('Your entry RM3 is still a draft')
    expect(toDrafter!.text).toContain('  - Add a flight recorder.')
    expect(toDrafter!.text).not.toContain('Add the collision-warning unit.')
    expect(toDrafter!.text).toContain('Enter the pilot’s nationality.')
    expect(toDrafter!.links).toContain(`${baseUrl}/competitions/${competitionId}/entries/${draft}`)

    // Each queued reminder is audited with its kind; each claim points at its message.
    const audits = await testDb()('audit_log').where({ action: 'reminder.queue' }).whereIn('subject_id', ours())
    expect(audits.map(r => [r.subject_id, r.details.kind]).sort()).toEqual([[submitted, 'pre-event-30'], [accepted, 'pre-event-30'], [draft, 'draft-30']].sort())
    expect(audits.every(r => r.actor_user_id === null)).toBe(true)
    const rows = await reminderRows(ours())
    expect(rows).toHaveLength(3)
    expect(rows.every(r => r.outbox_id !== null)).toBe(true)
  })

  it('the same day again: nothing more', async () => {
    const again = await run('2031-05-11T15:00:00Z')
    expect(kindsOf(again)).toEqual({})
    // What the job queues is in the outbox when it answers: still the first messages only.
    expect(await testDb()('mail_outbox').where({ to_address: entrantEmail })).toHaveLength(2)
    expect(await testDb()('mail_outbox').where({ to_address: drafterEmail })).toHaveLength(1)
  })

  it('14 days before: the second reminder, once', async () => {
    const res = await run('2031-05-27T08:00:00Z')
    expect(kindsOf(res)).toEqual({ [submitted]: 'pre-event-14', [accepted]: 'pre-event-14', [draft]: 'draft-14' })
    const messages = await waitForMail(entrantEmail, { count: 4 })
    expect(messages.filter(m => m.text.includes('(in 14 days)'))).toHaveLength(2)
    expect((await waitForMail(drafterEmail, { count: 2 })).filter(m => m.subject.startsWith('Finish your entry'))).toHaveLength(2)
    expect(kindsOf(await run('2031-05-28T08:00:00Z'))).toEqual({})
    expect((await reminderRows([submitted])).map(r => r.kind)).toEqual(['pre-event-14', 'pre-event-30'])
  })

  it('never to a withdrawn or rejected entry, nor to one with nothing open', async () => {
    const res = await run('2031-06-07T08:00:00Z') // 3 days before
    expect(Object.keys(kindsOf(res)).sort()).toEqual([submitted, accepted, draft].sort())
    expect(await reminderRows([settled, rejected, withdrawn])).toHaveLength(0)
    expect(await testDb()('mail_outbox').where({ to_address: goneEmail })).toHaveLength(0)
    // RM5's entrant was told of the waivers, never reminded.
    const settledMail = await testDb()('mail_outbox').where({ to_address: settledEmail })
    expect(settledMail.length).toBeGreaterThan(0)
    expect(settledMail.filter(m => m.template === 'pre-event-reminder')).toHaveLength(0)
  })

  it('sends nothing once the competition has started', async () => {
    const late = await createEntry({ competitionId, classId: (await testDb()('classes').where({ competition_id: competitionId }).first()).id, entrantUserId: (await testDb()('users').where({ email: entrantEmail }).first()).id, status: 'submitted', compId: 'RM4' })
    const res = await run('2031-06-10T09:00:00Z')
    expect(res.body.entryIds).not.toContain(late)
    expect(await reminderRows([late])).toHaveLength(0)
  })
})

describe('after days without a run', () => {
  let pilotEmail: string
  let entry: string
  let lateDraft: string
  let drafter: string

  beforeAll(async () => {
    const [o, p, d] = await Promise.all([signedUpClient(baseUrl, 'Otto Office'), signedUpClient(baseUrl, 'Pia Pilot'), signedUpClient(baseUrl, 'Del Drafter')])
    pilotEmail = p.email
    drafter = d.email
    const id = await createCompetition('Quiet Server Cup', [
      { userId: o.user.id, role: 'organiser' },
      { userId: p.user.id, role: 'entrant' },
      { userId: d.user.id, role: 'entrant' },
    ])
    await testDb()('competitions').where({ id }).update({ first_contest_day: '2031-08-20', last_contest_day: '2031-08-25', registration_closes_on: '2031-08-01' })
    expect((await o.client.request('PATCH', `/api/competitions/${id}`, { reminderDays: [20, 10] })).status).toBe(200)
    const classId = await createClass(id)
    entry = await createEntry({ competitionId: id, classId, entrantUserId: p.user.id, status: 'submitted', compId: 'QS1' })
    lateDraft = await createEntry({ competitionId: id, classId, entrantUserId: d.user.id, status: 'draft', compId: 'QS2' })
  })

  it('sends only the latest reminder due, not every one it missed; no draft reminder once registration has closed', async () => {
    // The job last ran long before; the server was down on the 20- and 10-day marks.
    const res = await run('2031-08-15T08:00:00Z') // 5 days before
    expect(res.body.reminders.filter((r: any) => [entry, lateDraft].includes(r.entryId))).toEqual([{ entryId: entry, kind: 'pre-event-10' }])
    const [message] = await waitForMail(pilotEmail)
    expect(message!.text).toContain('(in 5 days)')
    expect(await testDb()('mail_outbox').where({ to_address: pilotEmail })).toHaveLength(1)
    expect((await reminderRows([entry, lateDraft])).map(r => r.kind)).toEqual(['pre-event-10'])
    expect(await testDb()('mail_outbox').where({ to_address: drafter })).toHaveLength(0)
    expect((await run('2031-08-16T08:00:00Z')).body.entryIds).not.toContain(entry)
  })
})
