/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The day's grid pack through the built server: accepted entries only, with their dossiers
// (weigh-ins included), the field of every entry, the checklist, current tag codes and the
// day's last check; never cached; staff only.
import { randomBytes, createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'
import { SHORT_CODE_ALPHABET } from '../../../../shared/constants/grid'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let accepted: string
let checked: string
let submitted: string
let packPath: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Grid Pack Cup')
  accepted = await gridEntry(w, { compId: 'PA' })
  checked = await gridEntry(w, { compId: 'PB' })
  submitted = await gridEntry(w, { compId: 'PC', status: 'submitted' })
  packPath = `${w.base}/grid/pack`
})

/** A tag row as the tags helper writes it: a random token's hash and a short code. */
async function insertTag(entryId: string, issuedBy: string, revoked = false) {
  const token = randomBytes(32).toString('base64url').slice(0, 43)
  const shortCode = Array.from(randomBytes(8), b => SHORT_CODE_ALPHABET[b % SHORT_CODE_ALPHABET.length]).join('')
  const tokenHash = createHash('sha256').update(token).digest('hex')
  await testDb()('tags').insert({
    competition_id: w.competitionId, entry_id: entryId, token_hash: tokenHash, nonce: randomBytes(16).toString('base64url'),
    short_code: shortCode, issued_by: issuedBy, revoked_at: revoked ? new Date() : null, revoked_by: revoked ? issuedBy : null,
  })
  return { shortCode, tokenHash }
}

describe('GET /api/competitions/:id/grid/pack', () => {
  it('lists accepted entries only, with the checklist, the whole field, current tags and the day’s last check', async () => {
    await insertTag(accepted, w.organiser.user.id, true) // revoked: not in the pack
    const tag = await insertTag(accepted, w.organiser.user.id)
    const weighIn = { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 400, arm: 0.1 }, { point: 'tail-wheel', weight: 20, arm: 4.5 }] }
    const made = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(checked, { weighIn }))
    expect(made.status).toBe(201)

    const res = await w.scrutineer.client.get(packPath)
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('no-store')
    const pack = res.body
    expect(pack).toMatchObject({ competitionId: w.competitionId, competitionName: 'Grid Pack Cup', timeZone: 'Europe/Berlin', day: todayIn() })
    expect(Date.parse(pack.generatedAt)).not.toBeNaN()
    expect(pack.competition).toMatchObject({ firstContestDay: '2027-05-01', lastContestDay: '2027-05-07' })
    expect(pack.checklist.map((i: any) => i.id)).toEqual(['cwu-operating', 'cwu-firmware', 'recorder-declaration', 'antennas', 'ballast', 'tag-readable'])
    expect(pack.entries.map((e: any) => e.dossier.entry.compId)).toEqual(['PA', 'PB'])
    // The field keeps every entry, the submitted one too, for the uniqueness checks.
    expect(Object.keys(pack.field.entries)).toEqual(expect.arrayContaining([accepted, checked, submitted]))

    const [a, b] = pack.entries
    expect(a).toMatchObject({ classId: w.classId, tag, lastCheck: null })
    expect(a.dossier.units).toHaveLength(2)
    expect(a.dossier.weighIns).toEqual([])
    expect(b.tag).toBeNull()
    expect(b.lastCheck).toMatchObject({ id: made.body.gridCheck.id, outcome: 'pass', scrutineerName: 'Sam Scrutineer', scrutineerInitials: 'SS' })
    expect(b.dossier.gridCheck).toMatchObject({ day: todayIn(), outcome: 'pass' })
    expect(b.dossier.weighIns).toEqual([{ id: expect.any(String), declaredBallastKg: 0, weighedOn: todayIn(), units: 'kg-m', readings: weighIn.readings }])
  })

  it('gives another day on request: the check of today is not that day’s last check', async () => {
    const res = await w.director.client.get(`${packPath}?day=${shiftDay(todayIn(), -1)}`)
    expect(res.status).toBe(200)
    expect(res.body.day).toBe(shiftDay(todayIn(), -1))
    for (const e of res.body.entries) {
      expect(e.lastCheck).toBeNull()
      expect(e.dossier.gridCheck).toBeUndefined()
    }
    const bad = await w.director.client.get(`${packPath}?day=2027-02-30`)
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.day[0]).toContain('does not exist')
  })

  it('is for staff: organiser, director, scrutineer; entrants 403, outsiders 404, strangers 401', async () => {
    expect((await w.organiser.client.get(packPath)).status).toBe(200)
    expect((await w.director.client.get(packPath)).status).toBe(200)
    expect((await w.entrant.client.get(packPath)).status).toBe(403)
    expect((await w.outsider.client.get(packPath)).status).toBe(404)
    expect((await w.anonymous.get(packPath)).status).toBe(401)
    expect((await w.organiser.client.get('/api/competitions/not-an-id/grid/pack')).status).toBe(404)
  })
})
