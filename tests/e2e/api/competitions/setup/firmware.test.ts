// The firmware catalogue: staff read it, organisers keep it, and a CSV import is all or nothing.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../../support/db'
import { competitionWithRoles, rawRequest, type RoleClients } from '../../../../support/setup'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let t: RoleClients
let path: string
beforeAll(async () => {
  t = await competitionWithRoles(baseUrl, 'Setup Firmware Cup')
  path = `/api/competitions/${t.competitionId}/firmware`
})

describe('one release at a time', () => {
  let id: string
  it('lets the organiser add a release, audited', async () => {
    const res = await t.organiser.post(path, { unitFamily: 'Collision-warning unit A', version: '7.20', expiresOn: '2028-03-01' })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ unitFamily: 'Collision-warning unit A', version: '7.20', expiresOn: '2028-03-01' })
    id = res.body.id
    expect(await testDb()('audit_log').where({ subject_id: id, action: 'firmware.added' })).toHaveLength(1)
  })

  it('refuses the same family and version in another case with 409', async () => {
    const res = await t.organiser.post(path, { unitFamily: 'collision-warning UNIT a', version: '7.20', expiresOn: '2028-04-01' })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('The catalogue already lists this version for that unit family.')
  })

  it('answers 400 with field errors for a bad body', async () => {
    const res = await t.organiser.post(path, { unitFamily: '', version: '7.21', expiresOn: '2028-02-30' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.unitFamily[0]).toBe('Enter the unit family.')
    expect(res.body.data.fieldErrors.expiresOn[0]).toBe('That date does not exist.')
  })

  it('lets scrutineers and directors read, with canEdit false; the organiser gets canEdit true', async () => {
    for (const c of [t.scrutineer, t.director]) {
      const res = await c.get(path)
      expect(res.status).toBe(200)
      expect(res.body.canEdit).toBe(false)
      expect(res.body.releases.map((r: { version: string }) => r.version)).toEqual(['7.20'])
    }
    expect((await t.organiser.get(path)).body.canEdit).toBe(true)
  })

  it('refuses entrants (403), outsiders (404), strangers (401)', async () => {
    expect((await t.entrant.get(path)).status).toBe(403)
    expect((await t.outsider.get(path)).status).toBe(404)
    expect((await t.anonymous.get(path)).status).toBe(401)
  })

  it('refuses scrutineers and directors any change (403)', async () => {
    for (const c of [t.scrutineer, t.director]) {
      expect((await c.post(path, { unitFamily: 'X', version: '1', expiresOn: '2028-01-01' })).status).toBe(403)
      expect((await c.request('PATCH', `${path}/${id}`, { expiresOn: '2029-01-01' })).status).toBe(403)
      expect((await c.request('DELETE', `${path}/${id}`)).status).toBe(403)
      expect((await rawRequest(c, 'POST', `${path}/import`, 'unit_family,version,expires_on\nX,1,2028-01-01\n', 'text/csv')).status).toBe(403)
    }
  })

  it('changes and deletes a release, audited from → to', async () => {
    const changed = await t.organiser.request('PATCH', `${path}/${id}`, { expiresOn: '2028-06-01' })
    expect(changed.status).toBe(200)
    expect(changed.body.expiresOn).toBe('2028-06-01')
    const [log] = await testDb()('audit_log').where({ subject_id: id, action: 'firmware.changed' })
    expect(log.details.from.expiresOn).toBe('2028-03-01')
    expect(log.details.to.expiresOn).toBe('2028-06-01')
    expect((await t.organiser.request('DELETE', `${path}/${id}`)).status).toBe(204)
    expect((await t.organiser.request('DELETE', `${path}/${id}`)).status).toBe(404)
  })
})

describe('CSV import', () => {
  it('adds new lines and updates known ones (any case), reporting the counts', async () => {
    await t.organiser.post(path, { unitFamily: 'Unit B', version: '3.1', expiresOn: '2027-01-01' })
    const csv = 'unit_family,version,expires_on\nUnit B,3.1,2028-09-01\n"Unit C, portable",1.0,2028-10-01\nunit b,3.2,2029-01-01\n'
    const res = await rawRequest(t.organiser, 'POST', `${path}/import`, csv, 'text/csv')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ added: 2, updated: 1, total: 3 })
    const list = (await t.organiser.get(path)).body.releases
    expect(list.map((r: { unitFamily: string, version: string, expiresOn: string }) => [r.unitFamily, r.version, r.expiresOn])).toEqual([
      ['Unit B', '3.1', '2028-09-01'],
      ['unit b', '3.2', '2029-01-01'],
      ['Unit C, portable', '1.0', '2028-10-01'],
    ])
    const logs = await testDb()('audit_log').where({ competition_id: t.competitionId, action: 'firmware.imported' })
    expect(logs).toHaveLength(1)
    expect(logs[0].details.changes).toEqual([
      { unitFamily: 'Unit B', version: '3.1', from: '2027-01-01', to: '2028-09-01' },
      { unitFamily: 'Unit C, portable', version: '1.0', from: null, to: '2028-10-01' },
      { unitFamily: 'unit b', version: '3.2', from: null, to: '2029-01-01' },
    ])
  })

  it('refuses the whole file when any line is bad, naming each bad line by its number; nothing is imported', async () => {
    const before = (await t.organiser.get(path)).body.releases
    const csv = [
      'unit_family,version,expires_on',
      'Unit D,1.0,2028-01-01', // line 2: good
      'Unit D,,2028-01-01', // line 3: no version
      'Unit E,2.0,01/02/2028', // line 4: bad date
      '',
      'Unit D,1.0,2028-02-01', // line 6: repeats line 2
    ].join('\n')
    const res = await rawRequest(t.organiser, 'POST', `${path}/import`, csv, 'text/csv')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('3 lines of the CSV file need attention; nothing was imported.')
    expect(res.body.data.lineErrors).toEqual([
      { line: 3, messages: ['version: Enter the firmware version.'] },
      { line: 4, messages: ['expires_on: Enter a date as YYYY-MM-DD.'] },
      { line: 6, messages: ['version: the same unit family and version is already on line 2.'] },
    ])
    expect((await t.organiser.get(path)).body.releases).toEqual(before)
  })

  it('accepts a form upload and a JSON body with the text', async () => {
    const form = new FormData()
    form.append('file', new Blob(['expires_on,unit_family,version,notes\n2030-01-01,Unit F,9,extra column\n'], { type: 'text/csv' }), 'catalogue.csv')
    const upload = await rawRequest(t.organiser, 'POST', `${path}/import`, form)
    expect(upload.status).toBe(200)
    expect(upload.body).toEqual({ added: 1, updated: 0, total: 1 })
    const json = await t.organiser.post(`${path}/import`, { csv: 'unit_family,version,expires_on\nUnit F,9,2030-02-01\n' })
    expect(json.status).toBe(200)
    expect(json.body).toEqual({ added: 0, updated: 1, total: 1 })
  })

  it('answers 400 for missing columns or an empty file, and 415 for another media type', async () => {
    const columns = await rawRequest(t.organiser, 'POST', `${path}/import`, 'family,version\nA,1\n', 'text/csv')
    expect(columns.status).toBe(400)
    expect(columns.body.message).toBe('The first line must name the columns unit_family, version and expires_on.')
    const empty = await rawRequest(t.organiser, 'POST', `${path}/import`, 'unit_family,version,expires_on\n', 'text/csv')
    expect(empty.status).toBe(400)
    expect(empty.body.message).toBe('The CSV file has no lines to import.')
    const broken = await rawRequest(t.organiser, 'POST', `${path}/import`, 'unit_family,version,expires_on\n"Unit G,1,2028-01-01\n', 'text/csv')
    expect(broken.status).toBe(400)
    expect(broken.body.message).toMatch(/^The CSV file could not be read/)
    const other = await rawRequest(t.organiser, 'POST', `${path}/import`, 'x', 'application/octet-stream')
    expect(other.status).toBe(415)
  })

  it('refuses entrants (403), outsiders (404), strangers (401)', async () => {
    const csv = 'unit_family,version,expires_on\nX,1,2028-01-01\n'
    expect((await rawRequest(t.entrant, 'POST', `${path}/import`, csv, 'text/csv')).status).toBe(403)
    expect((await rawRequest(t.outsider, 'POST', `${path}/import`, csv, 'text/csv')).status).toBe(404)
    expect((await rawRequest(t.anonymous, 'POST', `${path}/import`, csv, 'text/csv')).status).toBe(401)
  })
})
