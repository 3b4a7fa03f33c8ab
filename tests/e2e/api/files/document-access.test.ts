// Need to know for pilots' medical and licence files, through the real routes: the file route's
// answer for every kind × role, the record of each opening (who, role, address) written before
// the bytes leave, and who reads that record (the pilot on their entry, the office per
// competition). Airworthiness and insurance openings are not recorded: they are the glider's
// papers, not the pilot's health or identity data, and the record is the pilot's to read.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { getBytes, postForm, tinyPdf } from '../../../support/files'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const KINDS = ['medical', 'licence', 'airworthiness', 'insurance'] as const
type Kind = typeof KINDS[number]
const CALLERS = ['pilot', 'other pilot', 'scrutineer', 'director', 'organiser', 'site admin without a role', 'staff of another competition'] as const
type Caller = typeof CALLERS[number]

/**
 * The expected status of GET …/documents/:id/file, every cell written out. 404: the entry is not
 * theirs to see (another pilot) or the competition is not theirs (staff elsewhere) — as before
 * need to know, nothing about the entry is revealed. 403: they see the entry and the document's
 * kind, validity and review outcome, never a medical or licence file.
 */
const MATRIX: Record<Caller, Record<Kind, number>> = {
  'pilot': { medical: 200, licence: 200, airworthiness: 200, insurance: 200 },
  'other pilot': { medical: 404, licence: 404, airworthiness: 404, insurance: 404 },
  'scrutineer': { medical: 200, licence: 200, airworthiness: 200, insurance: 200 },
  'director': { medical: 403, licence: 403, airworthiness: 200, insurance: 200 },
  'organiser': { medical: 200, licence: 200, airworthiness: 200, insurance: 200 },
  'site admin without a role': { medical: 403, licence: 403, airworthiness: 200, insurance: 200 },
  'staff of another competition': { medical: 404, licence: 404, airworthiness: 404, insurance: 404 },
}
/** The role an opening is recorded under. */
const LOGGED_AS: Partial<Record<Caller, string>> = { 'pilot': 'entrant', 'scrutineer': 'scrutineer', 'organiser': 'organiser' }

let competitionId: string
let entryId: string
let otherEntryId: string
const clients = {} as Record<Caller, ApiClient>
const ids = {} as Record<Caller, string>
const names = {} as Record<Caller, string>
const documentIds = {} as Record<Kind, string>

const docs = (entry = entryId) => `/api/competitions/${competitionId}/entries/${entry}/documents`
const fileOf = (kind: Kind) => `${docs()}/${documentIds[kind]}/file`
const entryLog = (entry = entryId) => `/api/competitions/${competitionId}/entries/${entry}/document-views`
const competitionLog = (query = '') => `/api/competitions/${competitionId}/document-views${query}`

async function viewRows(where: Record<string, string> = { entry_id: entryId }) {
  return testDb()('document_views').where(where).orderBy('id')
}

beforeAll(async () => {
  const people: [Caller, string][] = [
    ['pilot', 'Petra Pilot'], ['other pilot', 'Olli Otherpilot'], ['scrutineer', 'Sven Scrutineer'], ['director', 'Dora Director'],
    ['organiser', 'Orla Organiser'], ['site admin without a role', 'Abe Admin'], ['staff of another competition', 'Elsa Elsewhere'],
  ]
  for (const [caller, name] of people) {
    const signed = await signedUpClient(baseUrl, name)
    clients[caller] = signed.client
    ids[caller] = signed.user.id
    names[caller] = name
  }
  await testDb()('users').where({ id: ids['site admin without a role'] }).update({ is_admin: true })
  competitionId = await createCompetition('Need To Know Open', [
    { userId: ids.pilot, role: 'entrant' },
    { userId: ids['other pilot'], role: 'entrant' },
    { userId: ids.scrutineer, role: 'scrutineer' },
    { userId: ids.director, role: 'director' },
    { userId: ids.organiser, role: 'organiser' },
  ])
  await createCompetition('Elsewhere Trophy', [
    { userId: ids['staff of another competition'], role: 'organiser' },
    { userId: ids['staff of another competition'], role: 'scrutineer' },
  ])
  const classId = await createClass(competitionId)
  entryId = await createEntry({ competitionId, classId, entrantUserId: ids.pilot, compId: 'NK1' })
  otherEntryId = await createEntry({ competitionId, classId, entrantUserId: ids['other pilot'], compId: 'NK2' })
  for (const kind of KINDS) {
    const res = await postForm(clients.pilot, docs(), { kind, expiresOn: '2027-12-31' }, { name: `${kind}.pdf`, data: tinyPdf(`${kind} of NK1`), type: 'application/pdf' })
    if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`)
    documentIds[kind] = res.body.document.id
  }
})

describe('the file of each kind of document, for each caller', () => {
  it('answers as the matrix says, records each opening of a medical or licence file and nothing else', async () => {
    const seen: Record<string, Record<Kind, number>> = {}
    for (const caller of CALLERS) {
      seen[caller] = {} as Record<Kind, number>
      for (const kind of KINDS) {
        const before = (await viewRows()).length
        const res = await getBytes(clients[caller], fileOf(kind))
        seen[caller][kind] = res.status
        const rows = await viewRows()
        const personal = kind === 'medical' || kind === 'licence'
        if (res.status === 200) {
          expect(res.data.subarray(0, 5).toString(), `${caller} × ${kind}`).toBe('%PDF-')
          expect(res.headers.get('cache-control')).toBe('private, no-store')
        }
        else {
          expect(res.data.includes(Buffer.from('%PDF-')), `${caller} × ${kind} got no bytes`).toBe(false)
        }
        if (res.status === 200 && personal) {
          expect(rows.length, `${caller} × ${kind} is recorded once`).toBe(before + 1)
          expect(rows.at(-1)).toMatchObject({
            document_id: documentIds[kind],
            entry_id: entryId,
            competition_id: competitionId,
            document_kind: kind,
            viewer_user_id: ids[caller],
            viewer_role: LOGGED_AS[caller],
            client_address: clients[caller].address,
          })
        }
        else {
          expect(rows.length, `${caller} × ${kind} is not recorded`).toBe(before)
        }
      }
    }
    expect(seen).toEqual(MATRIX)
    // Three callers opened two personal files each.
    expect((await viewRows()).map(r => [r.viewer_user_id, r.document_kind])).toEqual([
      [ids.pilot, 'medical'], [ids.pilot, 'licence'],
      [ids.scrutineer, 'medical'], [ids.scrutineer, 'licence'],
      [ids.organiser, 'medical'], [ids.organiser, 'licence'],
    ])
  })

  it('tells the director and the site administrator why, in words, and a signed-out caller 401', async () => {
    for (const caller of ['director', 'site admin without a role'] as const) {
      const res = await clients[caller].get(fileOf('medical'))
      expect(res.status).toBe(403)
      expect(res.body.message).toBe('Only the pilot, the competition’s scrutineers and its organisers open medical and licence files. You can see the document’s kind, validity and review outcome on the entry.')
    }
    expect((await getBytes(new ApiClient(baseUrl), fileOf('medical'))).status).toBe(401)
  })

  it('serves a site administrator who holds the scrutineer role here, recorded as scrutineer', async () => {
    const admin = await signedUpClient(baseUrl, 'Astrid Adminscrutineer')
    await testDb()('users').where({ id: admin.user.id }).update({ is_admin: true })
    await testDb()('memberships').insert({ user_id: admin.user.id, competition_id: competitionId, role: 'scrutineer' })
    expect((await getBytes(admin.client, fileOf('licence'))).status).toBe(200)
    expect(await viewRows({ viewer_user_id: admin.user.id })).toEqual([expect.objectContaining({ viewer_role: 'scrutineer', document_kind: 'licence', client_address: admin.client.address })])
  })

  it('records every opening, and a replaced medical file the same as the current one', async () => {
    const before = (await viewRows({ viewer_user_id: ids.scrutineer })).length
    await getBytes(clients.scrutineer, fileOf('medical'))
    await getBytes(clients.scrutineer, fileOf('medical'))
    expect((await viewRows({ viewer_user_id: ids.scrutineer })).length).toBe(before + 2)

    const replaced = documentIds.medical
    const res = await postForm(clients.pilot, docs(), { kind: 'medical', expiresOn: '2028-06-30' }, { name: 'medical-2.pdf', data: tinyPdf('new medical') })
    expect(res.status).toBe(201)
    documentIds.medical = res.body.document.id
    expect((await getBytes(clients.director, `${docs()}/${replaced}/file`)).status).toBe(403)
    expect((await getBytes(clients.organiser, `${docs()}/${replaced}/file`)).status).toBe(200)
    expect(await viewRows({ document_id: replaced, viewer_user_id: ids.organiser })).toHaveLength(2)
  })

  it('serves nothing when the opening cannot be recorded', async () => {
    // A trigger refuses this one viewer's rows, as a full disk or a lost database would.
    const fn = `refuse_views_${ids.scrutineer.replace(/-/g, '')}`
    await testDb().raw(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.viewer_user_id = '${ids.scrutineer}' THEN RAISE EXCEPTION 'refused for the test'; END IF; RETURN NEW; END $$`)
    await testDb().raw(`CREATE TRIGGER ${fn} BEFORE INSERT ON document_views FOR EACH ROW EXECUTE FUNCTION ${fn}()`)
    try {
      const before = (await viewRows()).length
      const res = await getBytes(clients.scrutineer, fileOf('medical'))
      expect(res.status).toBeGreaterThanOrEqual(500)
      expect(res.data.includes(Buffer.from('%PDF-'))).toBe(false)
      expect((await viewRows()).length).toBe(before)
      // The glider's papers are not recorded, so they are still served.
      expect((await getBytes(clients.scrutineer, fileOf('airworthiness'))).status).toBe(200)
    }
    finally {
      await testDb().raw(`DROP TRIGGER ${fn} ON document_views`)
      await testDb().raw(`DROP FUNCTION ${fn}()`)
    }
  })
})

describe('reviewing a medical or licence document', () => {
  it('is refused to a site administrator who may not open it (403, still pending), allowed once they hold the scrutineer role', async () => {
    const admin = await signedUpClient(baseUrl, 'Rita Reviewadmin')
    await testDb()('users').where({ id: admin.user.id }).update({ is_admin: true })
    const review = (kind: Kind) => admin.client.post(`/api/competitions/${competitionId}/documents/${documentIds[kind]}/review`, { decision: 'accept' })
    const refused = await review('medical')
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(/scrutineer or organiser/)
    expect((await testDb()('documents').where({ id: documentIds.medical }).first()).status).toBe('pending')
    // The glider's papers are reviewed by any staff, administrators included (as before).
    expect((await review('insurance')).status).toBe(200)
    await testDb()('memberships').insert({ user_id: admin.user.id, competition_id: competitionId, role: 'scrutineer' })
    expect((await review('medical')).status).toBe(200)
  })
})

describe('what the lists tell the pages', () => {
  it('says who the caller is to the rule: the pilot, roles held, an administrator’s none', async () => {
    expect((await clients.pilot.get(docs())).body.fileAccess).toEqual({ isEntrant: true, rolesHeld: ['entrant'] })
    expect((await clients.director.get(docs())).body.fileAccess).toEqual({ isEntrant: false, rolesHeld: ['director'] })
    expect((await clients['site admin without a role'].get(docs())).body.fileAccess).toEqual({ isEntrant: false, rolesHeld: [] })
    const queue = await clients['site admin without a role'].get(`/api/competitions/${competitionId}/documents/queue`)
    expect(queue.status).toBe(200)
    expect(queue.body.fileAccess).toEqual({ isEntrant: false, rolesHeld: [] })
    expect((await clients.scrutineer.get(`/api/competitions/${competitionId}/documents/queue`)).body.fileAccess).toEqual({ isEntrant: false, rolesHeld: ['scrutineer'] })
  })

  it('names a medical or licence file only to those who may open it (a file name often carries the pilot’s name)', async () => {
    const names = async (client: ApiClient) => Object.fromEntries(((await client.get(docs())).body.current as { kind: string, originalFilename: string }[])
      .map(d => [d.kind, d.originalFilename]))
    // (an earlier test replaced the medical file with medical-2.pdf)
    const medical = expect.stringMatching(/^medical(-\d)?\.pdf$/)
    expect(await names(clients.pilot)).toMatchObject({ medical, licence: 'licence.pdf', insurance: 'insurance.pdf' })
    expect(await names(clients.scrutineer)).toMatchObject({ medical, licence: 'licence.pdf' })
    expect(await names(clients.director)).toMatchObject({ medical: '', licence: '', airworthiness: 'airworthiness.pdf', insurance: 'insurance.pdf' })
    expect(await names(clients['site admin without a role'])).toMatchObject({ medical: '', licence: '', insurance: 'insurance.pdf' })
  })
})

describe('the entry’s record of openings', () => {
  it('shows the pilot who opened their files, newest first: name, role, kind, when; no addresses', async () => {
    const res = await clients.pilot.get(entryLog())
    expect(res.status).toBe(200)
    const rows = await viewRows()
    expect(res.body.total).toBe(rows.length)
    expect(res.body.views).toHaveLength(rows.length)
    const newest = res.body.views[0]
    expect(newest).toEqual({
      id: expect.any(String),
      documentId: expect.any(String),
      documentKind: expect.stringMatching(/^(medical|licence)$/),
      viewerName: expect.any(String),
      viewerRole: expect.stringMatching(/^(entrant|scrutineer|organiser)$/),
      byEntrant: expect.any(Boolean),
      viewedAt: expect.any(String),
    })
    const times = res.body.views.map((v: { viewedAt: string }) => v.viewedAt)
    expect([...times].sort().reverse()).toEqual(times)
    const scrutineerViews = res.body.views.filter((v: { viewerName: string }) => v.viewerName === 'Sven Scrutineer')
    expect(scrutineerViews.length).toBeGreaterThan(0)
    expect(scrutineerViews.every((v: { viewerRole: string, byEntrant: boolean }) => v.viewerRole === 'scrutineer' && !v.byEntrant)).toBe(true)
    expect(res.body.views.filter((v: { byEntrant: boolean }) => v.byEntrant).map((v: { documentKind: string }) => v.documentKind).sort()).toEqual(['licence', 'medical'])
    expect(JSON.stringify(res.body)).not.toContain(clients.scrutineer.address)
  })

  it('is the pilot’s and the organisers’ only: other pilot 404, director and scrutineer 403, elsewhere 404', async () => {
    expect((await clients.organiser.get(entryLog())).status).toBe(200)
    expect((await clients['site admin without a role'].get(entryLog())).status).toBe(200)
    const director = await clients.director.get(entryLog())
    expect(director.status).toBe(403)
    expect(director.body.message).toBe('Only the pilot and the competition’s organisers see who opened the entry’s medical and licence files.')
    expect((await clients.scrutineer.get(entryLog())).status).toBe(403)
    expect((await clients['other pilot'].get(entryLog())).status).toBe(404)
    expect((await clients['staff of another competition'].get(entryLog())).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(entryLog())).status).toBe(401)
    // The other pilot reads their own entry's record: nobody opened anything there.
    const own = await clients['other pilot'].get(entryLog(otherEntryId))
    expect(own.status).toBe(200)
    expect(own.body).toMatchObject({ views: [], total: 0 })
    expect((await clients.pilot.get(`/api/competitions/${competitionId}/entries/not-a-uuid/document-views`)).status).toBe(404)
  })
})

describe('the competition’s record of openings', () => {
  it('shows the organisers every opening, newest first, with entry, kind, viewer, role and address', async () => {
    const res = await clients.organiser.get(competitionLog())
    expect(res.status).toBe(200)
    const rows = await testDb()('document_views').where({ competition_id: competitionId }).orderBy([{ column: 'viewed_at', order: 'desc' }, { column: 'id', order: 'desc' }])
    expect(res.body).toMatchObject({ total: rows.length, page: 1, pageSize: 50 })
    expect(res.body.rows.map((r: { id: string }) => r.id)).toEqual(rows.map(r => String(r.id)))
    const first = res.body.rows.find((r: { viewerName: string }) => r.viewerName === 'Orla Organiser')
    expect(first).toMatchObject({
      entry: { id: entryId, compId: 'NK1', pilotName: 'Test Pilot' },
      viewerRole: 'organiser',
      clientAddress: clients.organiser.address,
    })
    expect(['medical', 'licence']).toContain(first.documentKind)
  })

  it('pages back through the record', async () => {
    const total = (await viewRows({ competition_id: competitionId })).length
    const page1 = await clients.organiser.get(competitionLog('?pageSize=2'))
    const page2 = await clients.organiser.get(competitionLog('?pageSize=2&page=2'))
    expect(page1.body.rows).toHaveLength(2)
    expect(page2.body.rows).toHaveLength(Math.min(2, total - 2))
    expect(page2.body.rows[0].viewedAt <= page1.body.rows[1].viewedAt).toBe(true)
    expect(page1.body.rows.map((r: { id: string }) => r.id)).not.toContain(page2.body.rows[0].id)
  })

  it('refuses the director, scrutineers and pilots (403), staff elsewhere (404), a bad page (400)', async () => {
    const director = await clients.director.get(competitionLog())
    expect(director.status).toBe(403)
    expect(director.body.message).toBe('This needs the organiser role in this competition.')
    expect((await clients.scrutineer.get(competitionLog())).status).toBe(403)
    expect((await clients.pilot.get(competitionLog())).status).toBe(403)
    expect((await clients['staff of another competition'].get(competitionLog())).status).toBe(404)
    expect((await clients['site admin without a role'].get(competitionLog())).status).toBe(200)
    expect((await new ApiClient(baseUrl).get(competitionLog())).status).toBe(401)
    const bad = await clients.organiser.get(competitionLog('?page=0'))
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.page).toEqual(['Pages start at 1.'])
    expect((await clients.organiser.get(competitionLog('?pageSize=1000'))).status).toBe(400)
  })
})

describe('a deleted account', () => {
  it('takes its medical file with it, while the record that someone opened it stays', async () => {
    const leaving = await signedUpClient(baseUrl, 'Lena Leaving')
    await testDb()('memberships').insert({ user_id: leaving.user.id, competition_id: competitionId, role: 'entrant' })
    const classId = (await testDb()('entries').where({ id: entryId }).first()).class_id
    const entry = await createEntry({ competitionId, classId, entrantUserId: leaving.user.id, compId: 'NK3' })
    const up = await postForm(leaving.client, docs(entry), { kind: 'medical', expiresOn: '2027-12-31' }, { name: 'm.pdf', data: tinyPdf() })
    expect(up.status).toBe(201)
    expect((await getBytes(clients.scrutineer, `${docs(entry)}/${up.body.document.id}/file`)).status).toBe(200)
    const gone = await leaving.client.request('DELETE', '/api/me', { password: GOOD_PASSWORD, confirm: 'delete' })
    expect(gone.status).toBe(200)
    expect(await testDb()('documents').where({ id: up.body.document.id }).first()).toBeUndefined()
    expect(await viewRows({ entry_id: entry })).toEqual([
      expect.objectContaining({ document_id: null, document_kind: 'medical', viewer_user_id: ids.scrutineer, client_address: '' }),
    ])
  })
})
