// POST|PATCH|DELETE /api/competitions/:id/classes — organisers add FAI classes with their
// default limits (FAI Sporting Code Section 3 Annex A, values `from memory`) or custom classes.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { FAI_CLASSES } from '../../../../../shared/constants/classes'
import { closeTestDb, createEntry, testDb } from '../../../../support/db'
import { competitionWithRoles, type RoleClients } from '../../../../support/setup'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let t: RoleClients
let path: string
beforeAll(async () => {
  t = await competitionWithRoles(baseUrl, 'Setup Classes Cup')
  path = `/api/competitions/${t.competitionId}/classes`
})

describe('adding classes', () => {
  it('adds an FAI class with its default limits: 18 Metre, 18 m span, 600 kg, water ballast (Annex A, from memory)', async () => {
    const res = await t.organiser.post(path, { code: '18m', entryFeeMinor: 32000 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: '18 Metre', code: '18m', maxSpanM: 18, maxMtomKg: 600, waterBallast: true, entryFeeMinor: 32000, sortOrder: 0, entryCount: 0 })
    const [log] = await testDb()('audit_log').where({ subject_id: res.body.id, action: 'class.created' })
    expect(log.details.to.name).toBe('18 Metre')
    expect(log.details.from).toBeNull()
  })

  it('lets the organiser override a default: Club class without ballast, a chosen mass limit', async () => {
    const res = await t.organiser.post(path, { code: 'club', maxMtomKg: 500, entryFeeMinor: 25000 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Club', maxSpanM: null, maxMtomKg: 500, waterBallast: false, sortOrder: 1 })
  })

  it('adds a custom class, which needs a name', async () => {
    const nameless = await t.organiser.post(path, { code: 'custom' })
    expect(nameless.status).toBe(400)
    expect(nameless.body.data.fieldErrors.name[0]).toBe('Give the custom class a name.')
    const res = await t.organiser.post(path, { code: 'custom', name: 'Vintage', maxSpanM: null, maxMtomKg: null, waterBallast: false })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Vintage', code: 'custom', maxSpanM: null, waterBallast: false })
  })

  it('refuses an unknown FAI code, a second class of the same name, and bad limits', async () => {
    const unknown = await t.organiser.post(path, { code: '16m' })
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.fieldErrors.code[0]).toBe('Choose one of the FAI classes, or a custom class.')
    const twice = await t.organiser.post(path, { code: '18m' })
    expect(twice.status).toBe(400)
    expect(twice.body.data.fieldErrors.name[0]).toBe('This competition already has a class of that name.')
    const bad = await t.organiser.post(path, { code: 'standard', maxSpanM: -1, entryFeeMinor: 12.5 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.maxSpanM[0]).toBe('The maximum span must be more than 0.')
    expect(bad.body.data.fieldErrors.entryFeeMinor[0]).toBe('Enter the entry fee in whole cents.')
  })

  it('offers every FAI class of the list as a starting point', async () => {
    // The limits and their sources: tests/unit/shared/constants/classes.test.ts.
    expect(FAI_CLASSES.map(c => c.code)).toEqual(['open', '20m-two-seater', '18m', '15m', 'standard', 'club', '13.5m'])
  })
})

describe('changing and deleting classes', () => {
  it('changes limits and fee, audited as from → to', async () => {
    const created = await t.organiser.post(path, { code: '15m' })
    const res = await t.organiser.request('PATCH', `${path}/${created.body.id}`, { maxMtomKg: 500, entryFeeMinor: 28000 })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ maxMtomKg: 500, entryFeeMinor: 28000, maxSpanM: 15 })
    const [log] = await testDb()('audit_log').where({ subject_id: created.body.id, action: 'class.changed' })
    expect(log.details.changes).toEqual({ maxMtomKg: { from: 525, to: 500 }, entryFeeMinor: { from: 0, to: 28000 } })
  })

  it('refuses to delete a class that has entries (409) and deletes an empty one (204)', async () => {
    const used = await t.organiser.post(path, { code: 'open' })
    await createEntry({ competitionId: t.competitionId, classId: used.body.id, entrantUserId: t.ids.entrant })
    const refused = await t.organiser.request('DELETE', `${path}/${used.body.id}`)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/This class has 1 entry; move or withdraw it/)
    expect(await testDb()('classes').where({ id: used.body.id }).first()).toBeTruthy()

    const empty = await t.organiser.post(path, { code: '13.5m' })
    const res = await t.organiser.request('DELETE', `${path}/${empty.body.id}`)
    expect(res.status).toBe(204)
    expect(await testDb()('classes').where({ id: empty.body.id }).first()).toBeUndefined()
    expect(await testDb()('audit_log').where({ subject_id: empty.body.id, action: 'class.deleted' })).toHaveLength(1)
  })

  it('lists the classes with their entry counts in the set-up', async () => {
    const res = await t.organiser.get(`/api/competitions/${t.competitionId}/setup`)
    const open = res.body.classes.find((c: { code: string }) => c.code === 'open')
    expect(open.entryCount).toBe(1)
  })

  it('answers 404 for a class of another competition', async () => {
    const other = await competitionWithRoles(baseUrl, 'Setup Classes Other')
    const theirs = await other.organiser.post(`/api/competitions/${other.competitionId}/classes`, { code: 'club' })
    expect((await t.organiser.request('PATCH', `${path}/${theirs.body.id}`, { name: 'Mine' })).status).toBe(404)
    expect((await t.organiser.request('DELETE', `${path}/${theirs.body.id}`)).status).toBe(404)
  })

  it('refuses scrutineer, director, entrant (403), outsider (404), stranger (401)', async () => {
    for (const c of [t.scrutineer, t.director, t.entrant]) {
      expect((await c.post(path, { code: 'club', name: 'Club B' })).status).toBe(403)
    }
    expect((await t.outsider.post(path, { code: 'club', name: 'Club B' })).status).toBe(404)
    expect((await t.anonymous.post(path, { code: 'club', name: 'Club B' })).status).toBe(401)
    const some = await t.organiser.post(path, { code: 'custom', name: 'Spare' })
    for (const c of [t.scrutineer, t.director, t.entrant]) {
      expect((await c.request('PATCH', `${path}/${some.body.id}`, { name: 'X' })).status).toBe(403)
      expect((await c.request('DELETE', `${path}/${some.body.id}`)).status).toBe(403)
    }
    expect((await t.admin.request('DELETE', `${path}/${some.body.id}`)).status).toBe(204)
  })
})
