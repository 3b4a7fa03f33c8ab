// The pre-event reminder job, run through its admin route as of a chosen time: one e-mail per
// submitted or accepted entry, N days before the first contest day, exactly once.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let admin: ApiClient
let organiser: ApiClient
let competitionId: string
let entrantEmail: string
let submitted: string
let draft: string
let accepted: string

// A competition far in the future, so no other test's run of the job reaches it by accident.
const FIRST_DAY = '2031-06-10'

beforeAll(async () => {
  const a = await signedUpClient(baseUrl, 'Ada Admin')
  await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
  admin = a.client
  const o = await signedUpClient(baseUrl, 'Olga Organiser')
  organiser = o.client
  const e = await signedUpClient(baseUrl, 'Ezra Entrant')
  entrantEmail = e.email
  competitionId = await createCompetition('Reminder Cup', [
    { userId: o.user.id, role: 'organiser' },
    { userId: e.user.id, role: 'entrant' },
  ])
  await testDb()('competitions').where({ id: competitionId }).update({
    first_contest_day: FIRST_DAY, last_contest_day: '2031-06-20', settings: { reminderDaysBefore: 10 },
  })
  const classId = await createClass(competitionId)
  submitted = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: 'submitted', compId: 'RM1' })
  accepted = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: 'accepted', compId: 'RM2' })
  draft = await createEntry({ competitionId, classId, entrantUserId: e.user.id, status: 'draft', compId: 'RM3' })
  // RM2's pilot has paid: their reminder says nothing of the fee.
  await testDb()('entries').where({ id: accepted }).update({ payment_status: 'paid' })
  await testDb()('units').insert([
    { entry_id: accepted, competition_id: competitionId, kind: 'collision-warning', model: 'CW-1', serial: 'CW100', radio_id: 'ABC123', firmware_expires_on: '2031-06-15' },
    { entry_id: accepted, competition_id: competitionId, kind: 'flight-recorder', model: 'FR-2', serial: 'FR200', approval_level: 'all-flights' },
  ])
})

const run = (now: string, client = admin) => client.post('/api/admin/reminders/run', { now })

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

  it('sends nothing before the window opens', async () => {
    const res = await run('2031-05-30T12:00:00Z') // 11 days before
    expect(res.status).toBe(200)
    expect(res.body.entryIds).not.toContain(submitted)
    expect(await testDb()('mail_reminders').whereIn('entry_id', [submitted, accepted, draft])).toHaveLength(0)
  })

  it('queues one reminder per submitted or accepted entry, listing what is open, exactly once', async () => {
    const res = await run('2031-05-31T08:00:00Z') // 10 days before, in Europe/Berlin
    expect(res.status).toBe(200)
    expect(res.body.entryIds.sort()).toEqual([submitted, accepted].sort())

    const messages = await waitForMail(entrantEmail, { count: 2 })
    for (const m of messages) {
      expect(m.to).toEqual([entrantEmail])
      expect(m.subject).toBe('Reminder: Reminder Cup starts on 10 June 2031')
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
    expect(forAccepted.links).toContain(`${baseUrl}/competitions/${competitionId}/entries/${accepted}`)

    // Running again (even later in the window) sends nothing more.
    const again = await run('2031-06-05T08:00:00Z')
    expect(again.body.entryIds).not.toContain(submitted)
    expect(again.body.entryIds).not.toContain(accepted)
    // What the job queues is in the outbox when it answers: still the first two messages only.
    expect(await testDb()('mail_outbox').where({ to_address: entrantEmail })).toHaveLength(2)
    const rows = await testDb()('mail_reminders').whereIn('entry_id', [submitted, accepted, draft])
    expect(rows).toHaveLength(2)
    expect(rows.every(r => r.outbox_id !== null)).toBe(true)
  })

  it('sends nothing once the competition has started', async () => {
    const late = await createEntry({ competitionId, classId: (await testDb()('classes').where({ competition_id: competitionId }).first()).id, entrantUserId: (await testDb()('users').where({ email: entrantEmail }).first()).id, status: 'submitted', compId: 'RM4' })
    const res = await run('2031-06-10T09:00:00Z')
    expect(res.body.entryIds).not.toContain(late)
  })
})
