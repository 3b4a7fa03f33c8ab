/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// "The unit shows another version" on the grid, through the built server against PostgreSQL:
// the grid check corrects the collision-warning unit in the dossier (the unit form's audited
// change, naming the check), the checks run on what the unit showed, and the entry's own
// findings say the same afterwards. A replay corrects nothing twice; a unit that is not the
// glider's, or a version left empty, is refused with words and nothing is stored.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridCheckRows, gridEntry, gridWorld, shiftDay, type GridWorld } from '../../../support/grid'
import { auditRows } from '../../../support/entries'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let path: string
let lastContestDay: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Unit Display Cup')
  path = `${w.base}/grid-checks`
  const c = await testDb()('competitions').where({ id: w.competitionId }).first('last_contest_day')
  lastContestDay = String(c.last_contest_day)
})

async function cwUnit(entryId: string): Promise<any> {
  return testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).first()
}

describe('POST …/grid-checks with unitsShown', () => {
  it('corrects the unit to what it shows, audits it with the check, and judges the glider on it', async () => {
    const entryId = await gridEntry(w)
    const unit = await cwUnit(entryId)
    // The unit's display shows an older release that expires before the last contest day.
    const expires = shiftDay(lastContestDay, -3)
    const body = checkBody(entryId, { unitsShown: [{ unitId: unit.id, firmwareVersion: '6.02', firmwareExpiresOn: expires }] })
    const res = await w.scrutineer.client.post(path, body)
    expect(res.status).toBe(201)
    const check = res.body.gridCheck
    // The checks ran on what the unit showed (common practice: expired firmware stops the unit).
    const firmware = check.findings.find((f: any) => f.checkId === 'firmware.valid-through-contest')
    expect(firmware).toMatchObject({ severity: 'blocking', unitId: unit.id })
    expect(firmware.reason).toContain(expires)
    expect(check.readiness).not.toBe('ready')

    // The dossier now says what the unit showed.
    const after = await cwUnit(entryId)
    expect(after.firmware_version).toBe('6.02')
    expect(after.firmware_expires_on).toBe(expires)
    const entry = await testDb()('entries').where({ id: entryId }).first('changed_after_acceptance_at')
    expect(entry.changed_after_acceptance_at).not.toBeNull()

    // One audit row per field, as the unit form writes them, naming the grid check.
    const audited = await auditRows(unit.id, 'unit.updated')
    expect(audited.map(a => a.details.field).sort()).toEqual(['firmwareExpiresOn', 'firmwareVersion'])
    const version = audited.find(a => a.details.field === 'firmwareVersion')
    expect(version.actor_user_id).toBe(w.scrutineer.user.id)
    expect(version.details).toMatchObject({ entryId, from: unit.firmware_version, to: '6.02', via: 'grid-check', gridCheckId: check.id, day: body.day })

    // The entry's own findings (entry page, desk) agree with the grid.
    const findings = await w.organiser.client.get(`${w.base}/entries/${entryId}/findings`)
    expect(findings.status).toBe(200)
    const listed = JSON.stringify(findings.body)
    expect(listed).toContain('firmware.valid-through-contest')
    expect(listed).toContain(expires)

    // Sent again under its key (a phone that lost the answer): nothing is corrected twice.
    const replay = await w.scrutineer.client.post(path, body)
    expect(replay.status).toBe(200)
    expect(replay.body.replayed).toBe(true)
    expect(await auditRows(unit.id, 'unit.updated')).toHaveLength(2)
  })

  it('changes nothing when the unit shows what the dossier already says', async () => {
    const entryId = await gridEntry(w)
    const unit = await cwUnit(entryId)
    const res = await w.scrutineer.client.post(path, checkBody(entryId, {
      unitsShown: [{ unitId: unit.id, firmwareVersion: unit.firmware_version, firmwareExpiresOn: unit.firmware_expires_on }],
    }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.readiness).toBe('ready')
    expect(await auditRows(unit.id, 'unit.updated')).toHaveLength(0)
  })

  it('refuses a unit that is not this glider’s collision-warning unit, and stores nothing', async () => {
    const entryId = await gridEntry(w)
    const otherEntry = await gridEntry(w)
    const foreign = await cwUnit(otherEntry)
    const recorder = await testDb()('units').where({ entry_id: entryId, kind: 'flight-recorder' }).first()
    for (const unitId of [foreign.id, recorder.id]) {
      const body = checkBody(entryId, { unitsShown: [{ unitId, firmwareVersion: '7.77', firmwareExpiresOn: '2030-01-01' }] })
      const res = await w.scrutineer.client.post(path, body)
      expect(res.status).toBe(400)
      expect(res.body.data.fieldErrors.unitsShown[0]).toContain('no longer has in its dossier')
      expect(await gridCheckRows({ idempotency_key: body.idempotencyKey })).toHaveLength(0)
    }
    expect((await cwUnit(otherEntry)).firmware_version).toBe(foreign.firmware_version)
  })

  it('answers an empty version, a bad date or a unit sent twice with 400 in words', async () => {
    const entryId = await gridEntry(w)
    const unit = await cwUnit(entryId)
    const empty = await w.scrutineer.client.post(path, checkBody(entryId, { unitsShown: [{ unitId: unit.id, firmwareVersion: ' ', firmwareExpiresOn: '2030-01-01' }] }))
    expect(empty.status).toBe(400)
    expect(JSON.stringify(empty.body)).toContain('Enter the firmware version.')
    const badDate = await w.scrutineer.client.post(path, checkBody(entryId, { unitsShown: [{ unitId: unit.id, firmwareVersion: '7.1', firmwareExpiresOn: '2030-02-30' }] }))
    expect(badDate.status).toBe(400)
    expect(JSON.stringify(badDate.body)).toContain('That date does not exist.')
    const shown = { unitId: unit.id, firmwareVersion: '7.1', firmwareExpiresOn: '2030-01-01' }
    const twice = await w.scrutineer.client.post(path, checkBody(entryId, { unitsShown: [shown, shown] }))
    expect(twice.status).toBe(400)
    expect(twice.body.data.fieldErrors.unitsShown.join(' ')).toContain('sent once')
    expect((await cwUnit(entryId)).firmware_version).toBe(unit.firmware_version)
  })
})
