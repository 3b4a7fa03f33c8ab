// IGC files of an entry through the real routes. The valid fixture is invented and written by
// hand after the IGC GNSS FR specification Appendix A (A record, H records HFDTE, HFPLT,
// HFCM2, HFGTY, HFGID, HFCID, HFCCL, HFFTY, HFRFW; B records; G record, A2.5.7).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { getBytes, igcFixture, postForm, storedFileCount } from '../../../support/files'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let competitionId: string
let entryId: string
let recorderA: string
let recorderB: string
let warningUnit: string
let otherEntryRecorder: string
let owner: ApiClient
let otherEntrant: ApiClient
let scrutineer: ApiClient
let outsider: ApiClient

const igc = () => `/api/competitions/${competitionId}/entries/${entryId}/igc-files`

async function addUnit(entry: string, kind: 'flight-recorder' | 'collision-warning', serial: string) {
  const [row] = await testDb()('units').insert({
    entry_id: entry,
    competition_id: competitionId,
    kind,
    model: kind === 'flight-recorder' ? 'Test Recorder TR-1' : 'Test Warner',
    serial,
    ...(kind === 'collision-warning' ? { radio_id: 'ABC123', firmware_version: '7.1', firmware_expires_on: '2028-01-01' } : { approval_level: 'all-flights' }),
  }).returning('id')
  return row.id as string
}

async function igcRows() {
  return testDb()('igc_files').where({ entry_id: entryId }).count<{ count: string }[]>('id as count').then(r => Number(r[0]!.count))
}

beforeAll(async () => {
  const o = await signedUpClient(baseUrl, 'Recorder Owner')
  const e2 = await signedUpClient(baseUrl, 'Another Pilot')
  const s = await signedUpClient(baseUrl, 'Recorder Scrutineer')
  const out = await signedUpClient(baseUrl, 'Not A Member')
  owner = o.client
  otherEntrant = e2.client
  scrutineer = s.client
  outsider = out.client
  competitionId = await createCompetition('Recorder Trophy', [
    { userId: o.user.id, role: 'entrant' },
    { userId: e2.user.id, role: 'entrant' },
    { userId: s.user.id, role: 'scrutineer' },
  ])
  const classId = await createClass(competitionId)
  entryId = await createEntry({ competitionId, classId, entrantUserId: o.user.id, compId: 'KM1' })
  const otherEntry = await createEntry({ competitionId, classId, entrantUserId: e2.user.id, compId: 'KM2' })
  recorderA = await addUnit(entryId, 'flight-recorder', 'A-0001')
  recorderB = await addUnit(entryId, 'flight-recorder', 'B-0002')
  warningUnit = await addUnit(entryId, 'collision-warning', 'W-0003')
  otherEntryRecorder = await addUnit(otherEntry, 'flight-recorder', 'C-0004')
})

describe('IGC upload', () => {
  it('parses a valid file and stores its header (fixture after IGC FR specification Appendix A)', async () => {
    const res = await postForm(owner, igc(), { unitId: recorderA }, { name: 'KM1-flight.igc', data: igcFixture('valid-declaration.igc') })
    expect(res.status).toBe(201)
    expect(res.body.igcFile).toMatchObject({
      unitId: recorderA,
      originalFilename: 'KM1-flight.igc',
      flightDate: '2026-11-20', // HFDTEDATE:201126
      pilot: 'Marit Dovecote', // HFPLT
      copilot: 'Rowan Ashdown', // HFCM2
      gliderType: 'Kestrel Trainer 15', // HFGTY
      gliderId: 'D-KMOR', // HFGID
      competitionId: 'KM1', // HFCID
      competitionClass: 'Standard', // HFCCL
      recorderType: 'Test Recorder Works,TR-1', // HFFTY
      firmwareVersion: '2.4.1', // HFRFW
      hasGRecord: true, // G records present (A2.5.7)
      parseErrors: [],
      superseded: false,
    })
    const row = await testDb()('igc_files').where({ id: res.body.igcFile.id }).first()
    expect(row).toMatchObject({ glider_id: 'D-KMOR', declared_comp_id: 'KM1', declared_class: 'Standard', has_g_record: true })
    expect(storedFileCount('igc', entryId)).toBe(1)
    expect(await testDb()('audit_log').where({ subject_id: res.body.igcFile.id, action: 'igc-file.uploaded' }).first()).toBeTruthy()
  })

  it('answers 400 naming the parser’s first error and its line for a file that is not IGC; nothing is stored', async () => {
    const rows = await igcRows()
    const res = await postForm(owner, igc(), { unitId: recorderB }, { name: 'flight.igc', data: igcFixture('garbage.txt') })
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('This is not an IGC file: Missing A record (line 1).')
    expect(res.body.data.line).toBe(1)
    const noDate = await postForm(owner, igc(), {}, { name: 'no-date.igc', data: Buffer.from('AXGMK7Q\r\nB1201005130000N00745000EA0050000600\r\n') })
    expect(noDate.status).toBe(400)
    expect(noDate.body.message).toBe('This is not an IGC file: Missing HFDTE record before first B record (line 2).')
    expect(await igcRows()).toBe(rows)
    expect(storedFileCount('igc', entryId)).toBe(1)
  })

  it('collects lenient-mode errors with their line numbers on a file that is still IGC', async () => {
    const text = igcFixture('valid-declaration.igc').toString('latin1').replace('B1201205130040N00745060EA0051000610', 'B12012garbled')
    const res = await postForm(owner, igc(), {}, { name: 'scratched.igc', data: Buffer.from(text, 'latin1') })
    expect(res.status).toBe(201)
    expect(res.body.igcFile.unitId).toBeNull()
    expect(res.body.igcFile.parseErrors).toEqual([{ line: 15, message: 'Invalid B record' }])
  })

  it('refuses a file over 5 MB with 413; nothing is stored', async () => {
    const rows = await igcRows()
    const big = Buffer.concat([igcFixture('valid-declaration.igc'), Buffer.alloc(5 * 1024 * 1024, 0x4C)])
    const res = await postForm(owner, igc(), {}, { name: 'huge.igc', data: big })
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/larger than 5 MB/)
    expect(await igcRows()).toBe(rows)
  })

  it('answers 400 for a unit that is not a flight recorder of this entry, or no file', async () => {
    for (const unitId of [warningUnit, otherEntryRecorder, 'nope']) {
      const res = await postForm(owner, igc(), { unitId }, { name: 'f.igc', data: igcFixture('valid-declaration.igc') })
      expect(res.status).toBe(400)
      expect(res.body.data.fieldErrors.unitId).toBeTruthy()
    }
    const noFile = await postForm(owner, igc(), { unitId: recorderA })
    expect(noFile.status).toBe(400)
    expect(noFile.body.data.fieldErrors.file).toEqual(['Choose a file to upload.'])
  })

  it('refuses callers outside the entry: 401 signed out, 404 another entrant or a non-member', async () => {
    const file = { name: 'f.igc', data: igcFixture('valid-declaration.igc') }
    expect((await postForm(new ApiClient(baseUrl), igc(), {}, file)).status).toBe(401)
    expect((await postForm(otherEntrant, igc(), {}, file)).status).toBe(404)
    expect((await postForm(outsider, igc(), {}, file)).status).toBe(404)
  })
})

describe('IGC list, history and download', () => {
  it('supersedes the file from the same recorder and keeps the old one as history', async () => {
    const first = (await owner.get(igc())).body.current.find((f: { unitId: string }) => f.unitId === recorderA)
    const res = await postForm(scrutineer, igc(), { unitId: recorderA }, { name: 'KM1-newer.igc', data: igcFixture('valid-declaration.igc') })
    expect(res.status).toBe(201)
    const list = await owner.get(igc())
    expect(list.status).toBe(200)
    expect(list.body.current.map((f: { originalFilename: string }) => f.originalFilename).sort()).toEqual(['KM1-newer.igc', 'scratched.igc'])
    expect(list.body.history).toEqual([expect.objectContaining({ id: first.id, superseded: true, replacedBy: res.body.igcFile.id })])
  })

  it('lists to staff, never to another entrant', async () => {
    expect((await scrutineer.get(igc())).status).toBe(200)
    expect((await otherEntrant.get(igc())).status).toBe(404)
    expect((await outsider.get(igc())).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(igc())).status).toBe(401)
  })

  it('downloads the stored file byte for byte as a text/plain attachment', async () => {
    const current = (await owner.get(igc())).body.current.find((f: { unitId: string }) => f.unitId === recorderA)
    const path = `${igc()}/${current.id}/file`
    const res = await getBytes(owner, path)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/plain/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="KM1-newer.igc"/)
    expect(res.data.equals(igcFixture('valid-declaration.igc'))).toBe(true)
    expect((await getBytes(scrutineer, path)).status).toBe(200)
    expect((await getBytes(otherEntrant, path)).status).toBe(404)
    expect((await getBytes(new ApiClient(baseUrl), path)).status).toBe(401)
    expect((await getBytes(owner, `${igc()}/00000000-0000-4000-8000-000000000000/file`)).status).toBe(404)
  })
})
