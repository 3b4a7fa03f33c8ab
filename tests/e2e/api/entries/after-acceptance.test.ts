/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// An accepted entry stays its entrant's to keep current until the last contest day: units,
// documents, IGC files and contact data — re-checked at once and marked "changed since
// acceptance" for the office; its class, competition ID, registration and glider type stay the
// office's. And one status, said the same way: a document in review is the office's to act on.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { auditRows, collisionWarningUnit } from '../../../support/entries'
import { postForm, tinyPdf } from '../../../support/files'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'After Acceptance Cup')
})
const path = (id: string) => `${w.base}/entries/${id}`

describe('the entrant keeps an accepted entry current', () => {
  it('changes contact data and units: saved, audited, re-checked at once and marked changed since acceptance', async () => {
    const id = await gridEntry(w)
    expect((await testDb()('entries').where({ id }).first()).changed_after_acceptance_at).toBeNull()
    const res = await w.entrant.client.request('PATCH', path(id), { pilotPhone: '+44 7700 900999' })
    expect(res.status).toBe(200)
    expect(res.body.entry.pilotPhone).toBe('+44 7700 900999')
    expect(res.body.entry.changedAfterAcceptanceAt).not.toBeNull()
    expect(res.body.can.editNote).toContain('Keep the entry current until the last contest day')
    expect((await auditRows(id, 'entry.updated')).map(r => r.details.field)).toContain('pilotPhone')

    // K7's case: the firmware expires during the contest; the pilot updates it and the finding goes.
    const cw = await testDb()('units').where({ entry_id: id, kind: 'collision-warning' }).first()
    const expiring = collisionWarningUnit({ radioId: cw.radio_id, firmwareExpiresOn: '2027-05-03', firmwareUpdatedOn: '2027-01-10' })
    expect((await w.organiser.client.request('PATCH', `${path(id)}/units/${cw.id}`, expiring)).status).toBe(200)
    const before = await w.entrant.client.get(`${path(id)}/findings`)
    expect(before.body.findings.map((f: any) => f.checkId)).toContain('firmware.valid-through-contest')
    const dossier = await w.entrant.client.get(path(id))
    expect(dossier.body.progress.nextStep).toContain('The entry is accepted, but 1 finding keeps the glider from flying')
    const fixed = await w.entrant.client.request('PATCH', `${path(id)}/units/${cw.id}`, { ...expiring, firmwareVersion: '7.24', firmwareExpiresOn: '2029-01-31' })
    expect(fixed.status).toBe(200)
    const after = await w.entrant.client.get(`${path(id)}/findings`)
    expect(after.body.findings.map((f: any) => f.checkId)).not.toContain('firmware.valid-through-contest')

    // The office sees the mark on the entries table.
    const table = await w.organiser.client.get(`${w.base}/entries`)
    expect(table.body.rows.find((r: any) => r.id === id).changedAfterAcceptanceAt).not.toBeNull()
  })

  it('refuses a change of class, competition ID, registration or glider type with 403 naming them; the organiser may', async () => {
    const id = await gridEntry(w)
    for (const [body, words] of [
      [{ compId: 'ZZ9' }, 'competition ID'],
      [{ registration: 'G-NEWR' }, 'registration'],
      [{ classId: w.otherClassId }, 'class'],
      [{ gliderType: 'Other Type 18' }, 'glider type'],
    ] as const) {
      const res = await w.entrant.client.request('PATCH', path(id), body)
      expect(res.status, JSON.stringify(body)).toBe(403)
      expect(res.body.message).toBe(`The entry is accepted: only the office changes its ${words} now. Ask them with a message from the entry page.`)
    }
    // Sending an office field unchanged beside a contact change is fine (the form sends every field).
    const entry = await testDb()('entries').where({ id }).first()
    expect((await w.entrant.client.request('PATCH', path(id), { compId: entry.comp_id, emergencyContact: 'Pat, +44 7700 900000' })).status).toBe(200)
    expect((await w.organiser.client.request('PATCH', path(id), { compId: 'ZZ8' })).status).toBe(200)
  })

  it('refuses every change once the last contest day is over', async () => {
    const id = await gridEntry(w)
    const competition = await testDb()('competitions').where({ id: w.competitionId }).first('first_contest_day', 'last_contest_day')
    await testDb()('competitions').where({ id: w.competitionId }).update({ first_contest_day: '2020-07-01', last_contest_day: '2020-07-08' })
    try {
      const res = await w.entrant.client.request('PATCH', path(id), { pilotPhone: '+44 7700 900111' })
      expect(res.status).toBe(403)
      expect(res.body.message).toContain('The last contest day (8 July 2020) is over')
      const cw = await testDb()('units').where({ entry_id: id, kind: 'collision-warning' }).first()
      expect((await w.entrant.client.request('DELETE', `${path(id)}/units/${cw.id}`)).status).toBe(403)
    }
    finally {
      await testDb()('competitions').where({ id: w.competitionId }).update(competition)
    }
  })
})

describe('a document waiting for review', () => {
  it('is the office’s to act on: counted in review, said so in the next step, and no held e-mail', async () => {
    await testDb()('competitions').where({ id: w.competitionId }).update({ settings: { requiredDocumentKinds: ['insurance'] } })
    try {
      const id = await gridEntry(w)
      const upload = await postForm(w.entrant.client, `${path(id)}/documents`, { kind: 'insurance', expiresOn: '2028-12-31' }, { name: 'insurance.pdf', data: tinyPdf(), type: 'application/pdf' })
      expect(upload.status).toBe(201)
      // A new document after acceptance goes back to the review queue.
      const queue = await w.scrutineer.client.get(`${w.base}/documents/queue`)
      expect(JSON.stringify(queue.body)).toContain(upload.body.document.id)

      const dossier = await w.entrant.client.get(path(id))
      expect(dossier.body.findings).toEqual([expect.objectContaining({ checkId: 'documents.required', awaiting: 'review' })])
      expect(dossier.body.progress).toMatchObject({ open: { pilot: 0, inReview: 1, actor: 'office' } })
      expect(dossier.body.progress.nextStep).toBe('The entry is accepted. One document waits for a scrutineer’s review; nothing for you to do there.')
      const mine = await w.entrant.client.get('/api/me/entries')
      expect(mine.body.entries.find((e: any) => e.id === id).findings).toEqual({ blocking: 0, advisory: 0, inReview: 1 })

      // On the grid it still keeps the glider from ready, says "in review", and mails no one.
      await openToday(w).catch(() => undefined)
      const check = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id))
      expect(check.status).toBe(201)
      expect(check.body.gridCheck.readiness).toBe('held')
      const board = await w.director.client.get(`${w.base}/board`)
      expect(board.body.tiles.find((t: any) => t.entryId === id).headline.text).toMatch(/^In review: /)
      expect(await testDb()('mail_outbox').where({ entry_id: id, template: 'board-held' })).toHaveLength(0)
    }
    finally {
      await testDb()('competitions').where({ id: w.competitionId }).update({ settings: { requiredDocumentKinds: [] } })
    }
  })
})

describe('asking the office', () => {
  it('stores the entrant’s message, e-mails the organisers with a link to answer, and e-mails the answer back', async () => {
    const id = await gridEntry(w)
    const ask = await w.entrant.client.post(`${path(id)}/messages`, { body: 'Please change our competition ID to KT2: KT is painted on another glider in our club.' })
    expect(ask.status).toBe(201)
    expect(ask.body.message).toMatchObject({ fromOffice: false, authorName: 'Erin Entrant' })
    const toOffice = await testDb()('mail_outbox').where({ entry_id: id, template: 'entry-message' })
    expect(toOffice.map(m => m.to_address)).toEqual([w.organiser.email])
    expect(toOffice[0].text_body).toContain(`/competitions/${w.competitionId}/entries/${id}`)
    expect(toOffice[0].text_body).toContain('Please change our competition ID to KT2')

    const answer = await w.organiser.client.post(`${path(id)}/messages`, { body: 'Done: KT2 is yours.' })
    expect(answer.status).toBe(201)
    expect(answer.body.message.fromOffice).toBe(true)
    const toEntrant = await testDb()('mail_outbox').where({ entry_id: id, template: 'entry-message-answer' })
    expect(toEntrant.map(m => m.to_address)).toEqual([w.entrant.email])

    // Scrutineers read along; only the entrant and the organisers write; other entrants see nothing.
    const list = await w.scrutineer.client.get(`${path(id)}/messages`)
    expect(list.body.messages.map((m: any) => m.fromOffice)).toEqual([false, true])
    expect((await w.scrutineer.client.post(`${path(id)}/messages`, { body: 'A scrutineer note' })).status).toBe(403)
    expect((await w.otherEntrant.client.get(`${path(id)}/messages`)).status).toBe(404)
    const long = await w.entrant.client.post(`${path(id)}/messages`, { body: 'x'.repeat(2001) })
    expect(long.status).toBe(400)
    expect(long.body.data.fieldErrors.body).toEqual(['Keep the message under 2,000 characters.'])
    // The thread is in the entry's timeline, and the audit log holds only ids.
    const timeline = await w.entrant.client.get(`${path(id)}/timeline`)
    expect(timeline.body.items.filter((i: any) => i.kind === 'message').map((i: any) => i.summary)).toEqual(['The office answered: Done: KT2 is yours.', expect.stringContaining('Asked the office: Please change')])
    expect(JSON.stringify((await auditRows(id, 'entry.message')).map(r => r.details))).not.toContain('KT2')
  })
})
