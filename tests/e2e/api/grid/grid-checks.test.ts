/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Recording grid checks through the built server against PostgreSQL: the stored check with
// its findings and readiness; a replay under the same key stored once; a conflicting replay
// refused; bad input answered in words; who may record; two scrutineers on one entry; a
// weigh-in over the class limit and a failed item holding the glider; the lists.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridCheckRows, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'
import { auditRows } from '../../../support/entries'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let entryId: string
let path: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Grid Check Cup')
  entryId = await gridEntry(w)
  path = `${w.base}/grid-checks`
})

describe('POST /api/competitions/:id/grid-checks', () => {
  it('records a check: 201 with the stored answers, findings and readiness, and audits it', async () => {
    const body = checkBody(entryId)
    const res = await w.scrutineer.client.post(path, body)
    expect(res.status).toBe(201)
    expect(res.body.replayed).toBe(false)
    const c = res.body.gridCheck
    expect(c).toMatchObject({
      entryId, competitionId: w.competitionId, day: body.day, outcome: 'pass', readiness: 'ready', notes: 'Dry wings',
      foundBy: 'scan', idempotencyKey: body.idempotencyKey, weighIn: null,
      scrutineer: { id: w.scrutineer.user.id, name: 'Sam Scrutineer', initials: 'SS' },
    })
    expect(c.checkedAt).toBe(body.checkedAt)
    expect(Array.isArray(c.findings)).toBe(true)
    expect(c.findings.filter((f: any) => f.severity === 'blocking')).toEqual([])
    // Every item of the checklist is stored, in its order, with its label; unanswered ones as not checked.
    expect(c.answers.map((a: any) => a.itemId)).toEqual(['cwu-operating', 'cwu-firmware', 'recorder-declaration', 'antennas', 'ballast', 'tag-readable'])
    expect(c.answers[3]).toEqual({ itemId: 'antennas', label: 'Antennas fitted', result: 'pass', note: 'Both fitted' })
    expect(c.answers[2]).toMatchObject({ itemId: 'recorder-declaration', result: 'not-checked', note: '' })
    const audited = await auditRows(c.id, 'grid-check.recorded')
    expect(audited).toHaveLength(1)
    expect(audited[0].details).toMatchObject({ entryId, outcome: 'pass', readiness: 'ready' })
  })

  it('stores a check sent twice under one key once, and answers the second 200 replayed', async () => {
    const body = checkBody(entryId)
    const first = await w.scrutineer.client.post(path, body)
    expect(first.status).toBe(201)
    // The same check with its keys in another order and the time in another offset is the same check.
    const reordered = Object.fromEntries(Object.entries(body).reverse())
    const second = await w.scrutineer.client.post(path, { ...reordered, checkedAt: body.checkedAt.replace('Z', '+00:00') })
    expect(second.status).toBe(200)
    expect(second.body.replayed).toBe(true)
    expect(second.body.gridCheck.id).toBe(first.body.gridCheck.id)
    expect(await gridCheckRows({ idempotency_key: body.idempotencyKey })).toHaveLength(1)
    expect(await auditRows(first.body.gridCheck.id, 'grid-check.recorded')).toHaveLength(1)
  })

  it('stores one row when the same check arrives twice at once', async () => {
    const body = checkBody(entryId)
    const [a, b] = await Promise.all([w.scrutineer.client.post(path, body), w.scrutineer.client.post(path, body)])
    expect([a.status, b.status].sort()).toEqual([200, 201])
    expect(await gridCheckRows({ idempotency_key: body.idempotencyKey })).toHaveLength(1)
  })

  it('refuses another check under a used key with 409, and keeps the first', async () => {
    const body = checkBody(entryId)
    expect((await w.scrutineer.client.post(path, body)).status).toBe(201)
    const other = await w.scrutineer.client.post(path, { ...body, notes: 'Something else' })
    expect(other.status).toBe(409)
    expect(other.body.message).toContain('different grid check was already recorded')
    // The same body from another scrutineer is not theirs to replay.
    expect((await w.scrutineer2.client.post(path, body)).status).toBe(409)
    const rows = await gridCheckRows({ idempotency_key: body.idempotencyKey })
    expect(rows).toHaveLength(1)
    expect(rows[0].notes).toBe('Dry wings')
  })

  it('answers a malformed check with 400 and a message per field', async () => {
    const res = await w.scrutineer.client.post(path, { ...checkBody(entryId), idempotencyKey: 'nope', checkedAt: 'yesterday', answers: [{ itemId: 'antennas', result: 'maybe' }] })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fieldErrors)).toEqual(expect.arrayContaining(['idempotencyKey', 'checkedAt', 'answers']))
    expect(res.body.data.fieldErrors.answers.join(' ')).toContain('Answer pass, fail or not checked.')
    const extra = await w.scrutineer.client.post(path, { ...checkBody(entryId), colour: 'red' })
    expect(extra.status).toBe(400)
    const garbled = await w.scrutineer.client.postRaw(path, '{"entryId": ')
    expect(garbled.status).toBe(400)
    expect(garbled.body.message).toBe('The request body is not valid JSON.')
  })

  it('refuses an item that is not on the checklist, or one answered twice, naming it', async () => {
    const unknown = await w.scrutineer.client.post(path, checkBody(entryId, { answers: [{ itemId: 'wing-tape', result: 'pass' }] }))
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.fieldErrors.answers[0]).toContain('“wing-tape” is not on this competition’s checklist')
    const twice = await w.scrutineer.client.post(path, checkBody(entryId, { answers: [{ itemId: 'antennas', result: 'pass' }, { itemId: 'antennas', result: 'fail' }] }))
    expect(twice.status).toBe(400)
    expect(twice.body.data.fieldErrors.answers[0]).toContain('answered twice')
  })

  // Tomorrow is a day too, for a phone ahead of midnight; but then only a time within the slack
  // before midnight is believed, which the unit tests of gridCheckTimeProblem hold.
  it('takes today and 14 days back, and refuses days further out', async () => {
    const today = todayIn()
    for (const day of [today, shiftDay(today, -14)]) {
      expect((await w.scrutineer.client.post(path, checkBody(entryId, { day }))).status).toBe(201)
    }
    for (const day of [shiftDay(today, 2), shiftDay(today, -15)]) {
      const res = await w.scrutineer.client.post(path, checkBody(entryId, { day }))
      expect(res.status).toBe(400)
      expect(res.body.data.fieldErrors.day[0]).toContain('within 14 days')
    }
  })

  it('answers 403 for an entry of another competition, 404 for no entry, 409 for one not accepted', async () => {
    const elsewhere = await gridWorld(baseUrl, 'Other Grid Cup')
    const foreign = await gridEntry(elsewhere)
    const other = await w.scrutineer.client.post(path, checkBody(foreign))
    expect(other.status).toBe(403)
    expect(other.body.message).toContain('another competition')
    const none = await w.scrutineer.client.post(path, checkBody(randomUUID()))
    expect(none.status).toBe(404)
    expect(none.body.message).toContain('No such entry')
    const submitted = await gridEntry(w, { status: 'submitted' })
    const notAccepted = await w.scrutineer.client.post(path, checkBody(submitted))
    expect(notAccepted.status).toBe(409)
    expect(notAccepted.body.message).toContain('Only accepted entries')
    expect(await gridCheckRows({ entry_id: foreign })).toHaveLength(0)
    expect(await gridCheckRows({ entry_id: submitted })).toHaveLength(0)
  })

  it('lets scrutineers, the director and the organiser record; not entrants, outsiders, role-less admins or strangers', async () => {
    for (const who of [w.scrutineer, w.scrutineer2, w.director, w.organiser]) {
      expect((await who.client.post(path, checkBody(entryId))).status).toBe(201)
    }
    const entrant = await w.entrant.client.post(path, checkBody(entryId))
    expect(entrant.status).toBe(403)
    expect(entrant.body.message).toContain('role in this competition')
    expect((await w.outsider.client.post(path, checkBody(entryId))).status).toBe(404)
    expect((await w.admin.client.post(path, checkBody(entryId))).status).toBe(403)
    expect((await w.anonymous.post(path, checkBody(entryId))).status).toBe(401)
  })
})

describe('readiness from the check', () => {
  it('holds the glider when a checklist item failed', async () => {
    const id = await gridEntry(w)
    const res = await w.scrutineer.client.post(path, checkBody(id, { answers: [{ itemId: 'antennas', result: 'fail', note: 'Antenna cable loose' }] }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck).toMatchObject({ outcome: 'fail', readiness: 'held' })
  })

  it('gives a weigh-in over the class MTOM a blocking mass.class-limit finding and holds the glider', async () => {
    const id = await gridEntry(w)
    // Standard class limit 525 kg (the test class); 498 + 34 = 532 kg.
    const weighIn = { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 498, arm: 0.1 }, { point: 'tail-wheel', weight: 34, arm: 4.5 }] }
    const res = await w.scrutineer.client.post(path, checkBody(id, { weighIn }))
    expect(res.status).toBe(201)
    const c = res.body.gridCheck
    expect(c.readiness).toBe('held')
    expect(c.outcome).toBe('pass')
    const mass = c.findings.find((f: any) => f.checkId === 'mass.class-limit')
    expect(mass).toMatchObject({ severity: 'blocking' })
    expect(mass.reason).toContain('532.0 kg')
    // Mass × arm: (498·0.1 + 34·4.5) / 532 = 202.8 / 532 = 0.3812 m (FAA AC 43.13-1B ch. 10).
    expect(c.weighIn).toMatchObject({ units: 'kg-m', massKg: 532 })
    expect(c.weighIn.cgArmM).toBeCloseTo(0.3812, 4)
    const stored = await testDb()('weigh_ins').where({ grid_check_id: c.id })
    expect(stored).toHaveLength(1)
    expect(Number(stored[0].mass_kg)).toBe(532)
    // The weigh-in now feeds the dossier's findings too.
    const findings = await w.entrant.client.get(`${w.base}/entries/${id}/findings`)
    expect(findings.body.findings.map((f: any) => f.checkId)).toContain('mass.class-limit')
  })

  it('reads a weigh-in in lb and inches', async () => {
    const id = await gridEntry(w)
    expect((await w.scrutineer.client.request('PUT', `${w.base}/entries/${id}/occupant-masses`, { pilotMassKg: 70 })).status).toBe(200)
    // 900 lb + 100 lb = 1000 lb = 453.59 kg (1 lb = 0.45359237 kg exactly), + the pilot's 70 kg
    // = 523.59 kg take-off mass: under 525 kg.
    const weighIn = { units: 'lb-in', readings: [{ point: 'main-wheel', weight: 900, arm: 4 }, { point: 'tail-skid', weight: 100, arm: 180 }] }
    const res = await w.scrutineer.client.post(path, checkBody(id, { weighIn }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.weighIn.massKg).toBeCloseTo(523.59, 2)
    expect(res.body.gridCheck.findings.map((f: any) => f.checkId)).not.toContain('mass.class-limit')
    expect(res.body.gridCheck.readiness).toBe('ready')
  })
})

describe('two scrutineers on one entry', () => {
  it('keeps both checks; the later check by its time of checking wins, even when received first', async () => {
    const id = await gridEntry(w)
    const day = todayIn()
    const later = checkBody(id, { checkedAt: new Date(Date.now() - 60_000).toISOString(), answers: [{ itemId: 'antennas', result: 'pass' }] })
    const earlier = checkBody(id, { checkedAt: new Date(Date.now() - 600_000).toISOString(), answers: [{ itemId: 'antennas', result: 'fail' }] })
    const a = await w.scrutineer.client.post(path, later)
    const b = await w.scrutineer2.client.post(path, earlier) // queued offline, arrives second
    expect([a.status, b.status]).toEqual([201, 201])
    expect(await gridCheckRows({ entry_id: id })).toHaveLength(2)

    const list = await w.scrutineer.client.get(`${path}?day=${day}`)
    expect(list.status).toBe(200)
    const mine = list.body.gridChecks.filter((c: any) => c.entryId === id)
    expect(mine.map((c: any) => c.id)).toEqual([a.body.gridCheck.id, b.body.gridCheck.id])

    const pack = await w.scrutineer.client.get(`${w.base}/grid/pack?day=${day}`)
    const entry = pack.body.entries.find((e: any) => e.dossier.entry.id === id)
    expect(entry.lastCheck).toMatchObject({ id: a.body.gridCheck.id, outcome: 'pass', readiness: 'ready', scrutineerInitials: 'SS' })
    expect(entry.dossier.gridCheck).toMatchObject({ day, outcome: 'pass' })
  })
})

describe('the lists', () => {
  it('lists an entry’s checks for its entrant and the staff, newest first; not for other entrants', async () => {
    const id = await gridEntry(w)
    const today = todayIn()
    const old = await w.scrutineer.client.post(path, checkBody(id, { day: shiftDay(today, -1) }))
    const recent = await w.scrutineer.client.post(path, checkBody(id))
    const entryPath = `${w.base}/entries/${id}/grid-checks`
    const own = await w.entrant.client.get(entryPath)
    expect(own.status).toBe(200)
    expect(own.body.gridChecks.map((c: any) => c.id)).toEqual([recent.body.gridCheck.id, old.body.gridCheck.id])
    expect((await w.director.client.get(entryPath)).status).toBe(200)
    expect((await w.otherEntrant.client.get(entryPath)).status).toBe(404)
    expect((await w.anonymous.get(entryPath)).status).toBe(401)
  })

  it('lists a day’s checks for the staff only, and asks for a proper day', async () => {
    const day = shiftDay(todayIn(), -3)
    const id = await gridEntry(w)
    const made = await w.director.client.post(path, checkBody(id, { day }))
    const res = await w.organiser.client.get(`${path}?day=${day}`)
    expect(res.status).toBe(200)
    expect(res.body.gridChecks.every((c: any) => c.day === day)).toBe(true)
    expect(res.body.gridChecks.map((c: any) => c.id)).toContain(made.body.gridCheck.id)
    expect((await w.entrant.client.get(`${path}?day=${day}`)).status).toBe(403)
    const bad = await w.organiser.client.get(`${path}?day=tomorrow`)
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.day).toBeDefined()
  })
})
