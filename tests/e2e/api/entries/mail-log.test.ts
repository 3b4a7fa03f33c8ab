// GET /api/competitions/:id/entries/:entryId/mail — the organiser's log of an entry's e-mail:
// what the status changes queued, to whom, and whether the worker has sent it yet.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb } from '../../../support/db'
import { completeEntry, entriesWorld, entryBody, randomRadioId, type EntriesWorld } from '../../../support/entries'

const baseUrl = inject('baseUrl')
let w: EntriesWorld
let entryId: string
const path = () => `/api/competitions/${w.competitionId}/entries/${entryId}/mail`

beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Mail Log Cup')
  entryId = await completeEntry(w.entrant.client, w.competitionId, entryBody(w.classId, { compId: 'ML' }), randomRadioId())
  expect((await w.entrant.client.post(`/api/competitions/${w.competitionId}/entries/${entryId}/submit`)).status).toBe(200)
  expect((await w.organiser.client.post(`/api/competitions/${w.competitionId}/entries/${entryId}/accept`)).status).toBe(200)
})
afterAll(closeTestDb)

describe('GET …/entries/:entryId/mail', () => {
  it('lists the entry’s e-mail newest first, and shows it sent once the worker has delivered it', async () => {
    const deadline = Date.now() + 15_000
    let res = await w.organiser.client.get(path())
    while (res.body.mail?.some((m: { sentAt: string | null }) => !m.sentAt) && Date.now() < deadline) {
      await new Promise(r => setTimeout(r, 300))
      res = await w.organiser.client.get(path())
    }
    expect(res.status).toBe(200)
    const templates = res.body.mail.map((m: { template: string }) => m.template)
    expect(templates[0]).toBe('entry-accepted')
    expect(templates).toContain('entry-submitted')
    const accepted = res.body.mail[0]
    expect(accepted.to).toBe(w.entrant.email)
    expect(accepted.sentAt).not.toBeNull()
  })

  it('is for the organiser only: 403 for the entrant and the scrutineer, 404 for others, 401 signed out', async () => {
    expect((await w.entrant.client.get(path())).status).toBe(403)
    expect((await w.scrutineer.client.get(path())).status).toBe(403)
    expect((await w.otherEntrant.client.get(path())).status).toBe(404)
    expect((await w.outsider.client.get(path())).status).toBe(404)
    expect((await w.anonymous.get(path())).status).toBe(401)
    expect((await w.organiser.client.get(`/api/competitions/${w.competitionId}/entries/not-an-id/mail`)).status).toBe(404)
  })
})
