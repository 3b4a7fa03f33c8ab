/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The checks a scrutineering team makes, through the built server against PostgreSQL: the new
// fields validated in words (the engine, the registration weighing, the IGC recorder ID, a file's
// recorder named afterwards), and the new findings reaching the entry's findings, the grid
// check and the board. Sources of the values: see each test.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { auditRows, entryBody, flightRecorderUnit } from '../../../support/entries'
import { igcFixture, postForm } from '../../../support/files'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Scrutineering Cup')
  await openToday(w)
})
const entryPath = (id: string) => `${w.base}/entries/${id}`
const findingsOf = async (id: string) => {
  const res = await w.organiser.client.get(`${entryPath(id)}/findings`)
  expect(res.status).toBe(200)
  return res.body.findings as any[]
}
const ids = (findings: any[]) => findings.map(f => `${f.severity} ${f.checkId}`)
const tileOf = async (id: string) => {
  const res = await w.director.client.get(`${w.base}/board`)
  expect(res.status).toBe(200)
  return res.body.tiles.find((t: any) => t.entryId === id)
}

describe('the new fields, validated in words', () => {
  it('refuses an unknown engine kind and a lever arm out of range, each on its field', async () => {
    const res = await w.entrant.client.post(`${w.base}/entries`, entryBody(w.classId, { compId: 'V1', registration: 'G-VAL1', motorGlider: 'jet', pilotArmM: 12 }))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.motorGlider).toEqual(['Choose whether the glider has an engine: none, self-launching, sustainer or electric.'])
    expect(res.body.data.fieldErrors.pilotArmM).toEqual(['The pilot seat’s lever arm is between -5 and 5 m from the datum.'])
  })

  it('refuses an IGC recorder ID that is not the A record’s three or six characters', async () => {
    const id = await gridEntry(w)
    const res = await w.organiser.client.post(`${entryPath(id)}/units`, flightRecorderUnit({ serial: 'FR-BAD', igcRecorderId: 'AB' }))
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.igcRecorderId[0]).toMatch(/three-character manufacturer code and three-character serial id/)
    const ok = await w.organiser.client.post(`${entryPath(id)}/units`, flightRecorderUnit({ serial: 'FR-OK', igcRecorderId: 'xkm-a1b' }))
    expect(ok.status).toBe(201)
    expect(ok.body.igcRecorderId).toBe('XKMA1B')
  })

  it('records the registration weighing for staff only, in range, audited as numbers', async () => {
    const id = await gridEntry(w)
    const path = `${entryPath(id)}/occupant-masses`
    expect((await w.entrant.client.request('PUT', path, { pilotMassKg: 80 })).status).toBe(403)
    expect((await w.anonymous.request('PUT', path, { pilotMassKg: 80 })).status).toBe(401)
    const tooHeavy = await w.scrutineer.client.request('PUT', path, { pilotMassKg: 500 })
    expect(tooHeavy.status).toBe(400)
    expect(tooHeavy.body.data.fieldErrors.pilotMassKg).toEqual(['The pilot’s mass with parachute is at most 200 kg.'])
    expect((await w.scrutineer.client.request('PUT', path, {})).status).toBe(400)
    expect((await w.scrutineer.client.request('PUT', path, { pilotMassKg: 80, emptyMassKg: 1 })).status).toBe(400)
    const ok = await w.scrutineer.client.request('PUT', path, { pilotMassKg: 82.5, copilotMassKg: 71 })
    expect(ok.status).toBe(200)
    expect(ok.body.entry).toMatchObject({ pilotMassKg: 82.5, copilotMassKg: 71 })
    const rows = await auditRows(id, 'entry.occupant-mass-recorded')
    expect(rows.map(r => r.details)).toEqual([
      { field: 'pilotMassKg', from: null, to: 82.5 },
      { field: 'copilotMassKg', from: null, to: 71 },
    ])
  })
})

describe('an IGC file uploaded without naming its recorder', () => {
  it('is checked against the entry, the recorder without a file blocks, and naming it clears both', async () => {
    const id = await gridEntry(w)
    await testDb()('igc_files').where({ entry_id: id }).delete()
    expect(ids(await findingsOf(id))).toEqual(['blocking recorder.igc-file'])

    const upload = await postForm(w.entrant.client, `${entryPath(id)}/igc-files`, {}, { name: 'flight.igc', data: igcFixture('valid-declaration.igc') })
    expect(upload.status).toBe(201)
    const file = upload.body.igcFile
    // The A record and I record as Gridmark's parser reads them (IGC FR specification Appendix A).
    expect(file.recorderId).toMatch(/^[A-Z0-9]{6}$/)
    const loose = await findingsOf(id)
    expect(ids(loose)).toContain('blocking recorder.igc-file')
    expect(ids(loose)).toContain('advisory recorder.igc-file')
    // The fixture declares another glider: the file is checked against the entry all the same.
    expect(loose.some(f => f.checkId === 'declaration.matches-entry' && f.reason.includes('(no recorder named)'))).toBe(true)

    const recorder = await testDb()('units').where({ entry_id: id, kind: 'flight-recorder' }).first('id')
    const path = `${entryPath(id)}/igc-files/${file.id}/recorder`
    expect((await w.entrant.client.request('PUT', path, { unitId: 'not-a-uuid' })).status).toBe(400)
    const cw = await testDb()('units').where({ entry_id: id, kind: 'collision-warning' }).first('id')
    const notRecorder = await w.entrant.client.request('PUT', path, { unitId: cw.id })
    expect(notRecorder.status).toBe(400)
    expect(notRecorder.body.data.fieldErrors.unitId).toHaveLength(1)
    expect((await w.otherEntrant.client.request('PUT', path, { unitId: recorder.id })).status).toBe(404)
    const named = await w.entrant.client.request('PUT', path, { unitId: recorder.id })
    expect(named.status).toBe(200)
    expect(named.body.igcFile.unitId).toBe(recorder.id)
    expect(ids(await findingsOf(id)).filter(f => f.includes('recorder.igc-file'))).toEqual([])
    expect((await auditRows(file.id, 'igc-file.recorder-named'))).toHaveLength(1)
  })
})

describe('the new findings reach the entry, the grid check and the board', () => {
  it('a motor glider without engine recording blocks on the board; its rule is listed among the findings', async () => {
    const id = await gridEntry(w)
    const res = await w.organiser.client.request('PATCH', entryPath(id), { motorGlider: 'electric' })
    expect(res.status).toBe(200)
    expect(res.body.entry.motorGlider).toBe('electric')
    expect(ids(res.body.findings)).toEqual(['blocking motor-glider.engine-recording'])
    const tile = await tileOf(id)
    expect(tile.headline.checkId).toBe('motor-glider.engine-recording')
    expect(tile.counts.blocking).toBe(1)
  })

  it('an entry without a collision-warning unit blocks while the competition requires one, and not after the rule is turned off', async () => {
    const id = await gridEntry(w)
    const cw = await testDb()('units').where({ entry_id: id, kind: 'collision-warning' }).first('id')
    expect((await w.organiser.client.request('DELETE', `${entryPath(id)}/units/${cw.id}`)).status).toBeLessThan(300)
    expect(ids(await findingsOf(id))).toEqual(['blocking collision-warning.present'])
    expect((await tileOf(id)).headline.checkId).toBe('collision-warning.present')
    expect((await w.organiser.client.request('PATCH', w.base, { rules: { collisionWarningRequired: false } })).status).toBe(200)
    expect(ids(await findingsOf(id))).toEqual([])
    expect((await w.organiser.client.request('PATCH', w.base, { rules: { collisionWarningRequired: 'no' } })).status).toBe(400)
    expect((await w.organiser.client.request('PATCH', w.base, { rules: { collisionWarningRequired: true } })).status).toBe(200)
  })

  it('a span over the class limit blocks (Standard, 15 m: FAI Sporting Code Section 3 ch. 7.7)', async () => {
    const id = await gridEntry(w)
    const res = await w.organiser.client.request('PATCH', entryPath(id), { spanM: 18 })
    expect(ids(res.body.findings)).toEqual(['blocking span.class-limit'])
    expect((await tileOf(id)).headline.checkId).toBe('span.class-limit')
  })

  it('a weigh-in adds declared ballast and the pilot to the scale readings, each term stored, and blocks over the class limit', async () => {
    const id = await gridEntry(w)
    expect((await w.scrutineer.client.request('PUT', `${entryPath(id)}/occupant-masses`, { pilotMassKg: 90 })).status).toBe(200)
    // 380 + 30 kg on the scales + 40 kg declared ballast (weighed dry) + 90 kg pilot = 540 kg > 525 kg.
    const weighIn = { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 380, arm: 0.2 }, { point: 'tail-wheel', weight: 30, arm: 4.5 }], declaredBallastKg: 40 }
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id, { weighIn }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.weighIn.massKg).toBeCloseTo(540, 2)
    const found = res.body.gridCheck.findings.find((f: any) => f.checkId === 'mass.class-limit')
    expect(found.severity).toBe('blocking')
    expect(found.reason).toContain('540.0 kg (410.0 kg on the scales + declared water ballast 40.0 kg + pilot with parachute 90.0 kg)')
    expect(res.body.gridCheck.readiness).toBe('held')
    expect((await testDb()('weigh_ins').where({ entry_id: id }).first()).declared_ballast_kg).toBe('40.0')
    expect((await tileOf(id)).headline.checkId).toBe('mass.class-limit')
    const bad = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id, { weighIn: { ...weighIn, declaredBallastKg: -5 } }))
    expect(bad.status).toBe(400)
  })

  it('a class without water ballast adds its checklist item; failing it blocks on the grid and the board', async () => {
    const [club] = await testDb()('classes').insert({ competition_id: w.competitionId, name: 'Club Test', code: 'club', water_ballast: false, entry_fee_minor: 0 }).returning('id')
    const id = await gridEntry(w)
    await testDb()('entries').where({ id }).update({ class_id: club.id })
    await testDb()('igc_files').where({ entry_id: id }).update({ declared_class: 'Club Test' })
    const base = checkBody(id)
    const failed = await w.scrutineer.client.post(`${w.base}/grid-checks`, { ...base, answers: [...base.answers, { itemId: 'water-ballast-empty', result: 'fail' }] })
    expect(failed.status).toBe(201)
    expect(failed.body.gridCheck.answers.map((a: any) => a.itemId)).toContain('water-ballast-empty')
    const ballast = failed.body.gridCheck.findings.find((f: any) => f.checkId === 'ballast.class-rule')
    expect(ballast).toMatchObject({ severity: 'blocking' })
    expect(ballast.caution).toMatch(/Power the unit off/)
    // The board leads with the failed item; the finding is counted among the blocking ones.
    const tile = await tileOf(id)
    expect(tile.readiness).toBe('held')
    expect(tile.headline).toMatchObject({ kind: 'checklist' })
    expect(tile.counts.blocking).toBe(1)

    // A class that carries water ballast has no such item.
    const standard = await gridEntry(w)
    const other = checkBody(standard)
    const refused = await w.scrutineer.client.post(`${w.base}/grid-checks`, { ...other, answers: [...other.answers, { itemId: 'water-ballast-empty', result: 'pass' }] })
    expect(refused.status).toBe(400)
    expect(refused.body.data.fieldErrors.answers[0]).toMatch(/water-ballast-empty/)
  })
})

describe('a unit with its IGC recorder ID', () => {
  it('advises when the file comes from another recorder than the one declared (IGC FR specification Appendix A, A record)', async () => {
    const id = await gridEntry(w)
    const recorder = await testDb()('units').where({ entry_id: id, kind: 'flight-recorder' }).first()
    await testDb()('igc_files').where({ entry_id: id }).update({ recorder_id: 'XKMQQQ' })
    const body = flightRecorderUnit({ serial: recorder.serial, igcRecorderId: 'XKM-A1B' })
    const res = await w.organiser.client.request('PATCH', `${entryPath(id)}/units/${recorder.id}`, body)
    expect(res.status).toBe(200)
    const f = (await findingsOf(id)).find(x => x.checkId === 'recorder.identity')
    expect(f.severity).toBe('advisory')
    expect(f.reason).toContain('comes from recorder XKM-QQQ, but the Example Logger 3 is declared with IGC recorder ID XKM-A1B')
  })

})
