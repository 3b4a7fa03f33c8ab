// Documents of an entry through the real routes: upload refusals (size, type by content),
// the owner/staff boundary, the review queue, rejection e-mail, history and inline viewing.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { getBytes, postForm, storedFileCount, tinyJpeg, tinyPdf, tinyPng } from '../../../support/files'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let competitionId: string
let otherCompetitionId: string
let entryId: string
let otherEntryId: string
let owner: ApiClient
let ownerEmail: string
let otherEntrant: ApiClient
let scrutineer: ApiClient
let organiser: ApiClient
let director: ApiClient
let outsider: ApiClient

const docs = (entry = entryId) => `/api/competitions/${competitionId}/entries/${entry}/documents`

beforeAll(async () => {
  const o = await signedUpClient(baseUrl, 'Owner Pilot')
  const e2 = await signedUpClient(baseUrl, 'Other Pilot')
  const s = await signedUpClient(baseUrl, 'Desk Scrutineer')
  const org = await signedUpClient(baseUrl, 'Office Organiser')
  const d = await signedUpClient(baseUrl, 'Day Director')
  const out = await signedUpClient(baseUrl, 'Outside Person')
  owner = o.client
  ownerEmail = o.email
  otherEntrant = e2.client
  scrutineer = s.client
  organiser = org.client
  director = d.client
  outsider = out.client
  competitionId = await createCompetition('Documents Open', [
    { userId: o.user.id, role: 'entrant' },
    { userId: e2.user.id, role: 'entrant' },
    { userId: s.user.id, role: 'scrutineer' },
    { userId: org.user.id, role: 'organiser' },
    { userId: d.user.id, role: 'director' },
  ])
  otherCompetitionId = await createCompetition('Elsewhere Cup', [{ userId: s.user.id, role: 'scrutineer' }])
  const classId = await createClass(competitionId)
  entryId = await createEntry({ competitionId, classId, entrantUserId: o.user.id, compId: 'DK1' })
  otherEntryId = await createEntry({ competitionId, classId, entrantUserId: e2.user.id, compId: 'DK2' })
})

async function documentRows(entry: string) {
  return testDb()('documents').where({ entry_id: entry }).count<{ count: string }[]>('id as count').then(r => Number(r[0]!.count))
}

describe('document upload', () => {
  it('stores a PDF for its entrant, with metadata and sha256, pending review', async () => {
    const pdf = tinyPdf('Airworthiness review')
    const res = await postForm(owner, docs(), { kind: 'airworthiness', expiresOn: '2027-09-30' }, { name: 'arc.pdf', data: pdf, type: 'application/pdf' })
    expect(res.status).toBe(201)
    expect(res.body.document).toMatchObject({
      kind: 'airworthiness',
      originalFilename: 'arc.pdf',
      mediaType: 'application/pdf',
      sizeBytes: pdf.length,
      expiresOn: '2027-09-30',
      status: 'pending',
      superseded: false,
      uploadedByName: 'Owner Pilot',
    })
    const { createHash } = await import('node:crypto')
    expect(res.body.document.sha256).toBe(createHash('sha256').update(pdf).digest('hex'))
    expect(storedFileCount('documents', entryId)).toBe(1)
    const audit = await testDb()('audit_log').where({ subject_id: res.body.document.id, action: 'document.uploaded' }).first()
    expect(audit).toBeTruthy()
  })

  it('accepts PNG and JPEG by their content, whatever the name says', async () => {
    const png = await postForm(owner, docs(), { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'insurance.bin', data: tinyPng() })
    expect(png.status).toBe(201)
    expect(png.body.document.mediaType).toBe('image/png')
    const jpeg = await postForm(owner, docs(), { kind: 'licence', expiresOn: '2028-03-01' }, { name: 'licence', data: tinyJpeg() })
    expect(jpeg.status).toBe(201)
    expect(jpeg.body.document.mediaType).toBe('image/jpeg')
  })

  it('refuses a text file named .pdf with 415 and a sentence naming what is accepted; nothing is stored', async () => {
    const rows = await documentRows(entryId)
    const files = storedFileCount('documents', entryId)
    const res = await postForm(owner, docs(), { kind: 'medical', expiresOn: '2027-10-01' }, { name: 'medical.pdf', data: Buffer.from('just some text, not a PDF'), type: 'application/pdf' })
    expect(res.status).toBe(415)
    expect(res.body.message).toBe('That file is not a PDF, JPEG or PNG. Only PDF documents and JPEG or PNG images are accepted, checked by their content rather than their name.')
    expect(await documentRows(entryId)).toBe(rows)
    expect(storedFileCount('documents', entryId)).toBe(files)
  })

  it('refuses a file just over 10 MB with 413 (after reading) and one far over it (from Content-Length); nothing is stored', async () => {
    const rows = await documentRows(entryId)
    const files = storedFileCount('documents', entryId)
    const justOver = Buffer.concat([tinyPdf(), Buffer.alloc(10 * 1024 * 1024 + 1 - tinyPdf().length, 0x20)])
    const a = await postForm(owner, docs(), { kind: 'medical', expiresOn: '2027-10-01' }, { name: 'big.pdf', data: justOver })
    expect(a.status).toBe(413)
    expect(a.body.message).toMatch(/larger than 10 MB/)
    const farOver = Buffer.concat([tinyPdf(), Buffer.alloc(12 * 1024 * 1024, 0x20)])
    const b = await postForm(owner, docs(), { kind: 'medical', expiresOn: '2027-10-01' }, { name: 'bigger.pdf', data: farOver })
    expect(b.status).toBe(413)
    expect(await documentRows(entryId)).toBe(rows)
    expect(storedFileCount('documents', entryId)).toBe(files)
  })

  it('answers 400 with field messages for a bad kind, a bad date or no file', async () => {
    const badKind = await postForm(owner, docs(), { kind: 'passport', expiresOn: '2027-10-01' }, { name: 'a.pdf', data: tinyPdf() })
    expect(badKind.status).toBe(400)
    expect(badKind.body.data.fieldErrors.kind).toEqual(['Choose what kind of document this is.'])
    const badDate = await postForm(owner, docs(), { kind: 'medical', expiresOn: '31.10.2027' }, { name: 'a.pdf', data: tinyPdf() })
    expect(badDate.status).toBe(400)
    expect(badDate.body.data.fieldErrors.expiresOn[0]).toBe('Enter a date as YYYY-MM-DD.')
    const noFile = await postForm(owner, docs(), { kind: 'medical', expiresOn: '2027-10-01' })
    expect(noFile.status).toBe(400)
    expect(noFile.body.data.fieldErrors.file).toEqual(['Choose a file to upload.'])
    const json = await owner.post(docs(), { kind: 'medical' })
    expect(json.status).toBe(400)
    expect(json.body.message).toMatch(/multipart\/form-data/)
  })

  it('refuses callers outside the entry: 401 signed out, 404 another entrant or a non-member', async () => {
    const form = { kind: 'other', expiresOn: '2027-10-01' }
    const file = { name: 'x.pdf', data: tinyPdf() }
    expect((await postForm(new ApiClient(baseUrl), docs(), form, file)).status).toBe(401)
    const other = await postForm(otherEntrant, docs(), form, file)
    expect(other.status).toBe(404)
    expect(other.body.message).toBe('No such entry in this competition, or it is not yours.')
    expect((await postForm(outsider, docs(), form, file)).status).toBe(404)
    expect(storedFileCount('documents', entryId)).toBe(3)
  })

  it('lets staff upload for an entry', async () => {
    const res = await postForm(organiser, docs(otherEntryId), { kind: 'other', expiresOn: '2027-10-01' }, { name: 'note.png', data: tinyPng() })
    expect(res.status).toBe(201)
    expect(res.body.document.uploadedByName).toBe('Office Organiser')
  })
})

describe('document list and file', () => {
  it('lists the entry’s current documents to its entrant and staff, never to another entrant', async () => {
    const mine = await owner.get(docs())
    expect(mine.status).toBe(200)
    expect(mine.body.current.map((d: { kind: string }) => d.kind)).toEqual(['airworthiness', 'insurance', 'licence'])
    expect((await scrutineer.get(docs())).status).toBe(200)
    expect((await director.get(docs())).status).toBe(200)
    expect((await otherEntrant.get(docs())).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(docs())).status).toBe(401)
    expect((await outsider.get(docs())).status).toBe(404)
    expect((await owner.get(`/api/competitions/${competitionId}/entries/not-a-uuid/documents`)).status).toBe(404)
  })

  it('serves the file inline with its type and nosniff, to its entrant and staff only', async () => {
    const list = await owner.get(docs())
    const pdf = list.body.current.find((d: { kind: string }) => d.kind === 'airworthiness')
    const path = `${docs()}/${pdf.id}/file`
    const res = await getBytes(owner, path)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toMatch(/^inline; filename="arc.pdf"/)
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.data.subarray(0, 5).toString()).toBe('%PDF-')
    expect((await getBytes(scrutineer, path)).status).toBe(200)
    expect((await getBytes(otherEntrant, path)).status).toBe(404)
    expect((await getBytes(new ApiClient(baseUrl), path)).status).toBe(401)
    // The document's id under another entry names nothing.
    const other = await getBytes(organiser, `${docs(otherEntryId)}/${pdf.id}/file`)
    expect(other.status).toBe(404)
  })
})

describe('review queue', () => {
  const queue = () => `/api/competitions/${competitionId}/documents/queue`
  const review = (id: string) => `/api/competitions/${competitionId}/documents/${id}/review`

  it('shows scrutineers and organisers the pending documents, oldest first, with comp ID and pilot', async () => {
    const res = await scrutineer.get(queue())
    expect(res.status).toBe(200)
    expect(res.body.documents.map((d: { kind: string, compId: string }) => [d.compId, d.kind])).toEqual([
      ['DK1', 'airworthiness'], ['DK1', 'insurance'], ['DK1', 'licence'], ['DK2', 'other'],
    ])
    expect(res.body.documents[0]).toMatchObject({ pilotName: 'Test Pilot', status: 'pending' })
    expect((await organiser.get(queue())).status).toBe(200)
  })

  it('refuses the queue to a director and an entrant (403), a non-member (404), signed out (401)', async () => {
    const d = await director.get(queue())
    expect(d.status).toBe(403)
    expect(d.body.message).toBe('This needs the scrutineer or organiser role in this competition.')
    expect((await owner.get(queue())).status).toBe(403)
    expect((await outsider.get(queue())).status).toBe(404)
    expect((await new ApiClient(baseUrl).get(queue())).status).toBe(401)
  })

  it('accepts a document, audited, and takes it off the queue', async () => {
    const q = await scrutineer.get(queue())
    const arc = q.body.documents.find((d: { kind: string }) => d.kind === 'airworthiness')
    const res = await scrutineer.post(review(arc.id), { decision: 'accept' })
    expect(res.status).toBe(200)
    expect(res.body.document).toMatchObject({ status: 'accepted', reviewedByName: 'Desk Scrutineer', reviewReason: null })
    expect(await testDb()('audit_log').where({ subject_id: arc.id, action: 'document.accepted' }).first()).toBeTruthy()
    const again = await scrutineer.post(review(arc.id), { decision: 'accept' })
    expect(again.status).toBe(409)
    const after = await scrutineer.get(queue())
    expect(after.body.documents.some((d: { id: string }) => d.id === arc.id)).toBe(false)
  })

  it('rejects with a reason and queues an e-mail to the entrant in the same step', async () => {
    const q = await organiser.get(queue())
    const ins = q.body.documents.find((d: { kind: string }) => d.kind === 'insurance')
    const res = await organiser.post(review(ins.id), { decision: 'reject', reason: 'The certificate ends before the last contest day.' })
    expect(res.status).toBe(200)
    expect(res.body.document).toMatchObject({ status: 'rejected', reviewReason: 'The certificate ends before the last contest day.' })
    const mail = await testDb()('mail_outbox').where({ entry_id: entryId, template: 'document-rejected' }).first()
    expect(mail).toMatchObject({ to_address: ownerEmail, competition_id: competitionId })
    expect(mail.text_body).toContain('The certificate ends before the last contest day.')
    expect(mail.text_body).toContain(`Upload a corrected document:\n${baseUrl}/competitions/${competitionId}/entries/${entryId}`)
    expect(await testDb()('audit_log').where({ subject_id: ins.id, action: 'document.rejected' }).first()).toBeTruthy()
  })

  it('answers 400 for a rejection without a reason or an unknown decision, 403/404 for wrong callers', async () => {
    const q = await scrutineer.get(queue())
    const lic = q.body.documents.find((d: { kind: string }) => d.kind === 'licence')
    const noReason = await scrutineer.post(review(lic.id), { decision: 'reject' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fieldErrors.reason).toEqual(['Say why the document is rejected.'])
    expect((await scrutineer.post(review(lic.id), { decision: 'maybe' })).status).toBe(400)
    expect((await owner.post(review(lic.id), { decision: 'accept' })).status).toBe(403)
    expect((await director.post(review(lic.id), { decision: 'accept' })).status).toBe(403)
    expect((await outsider.post(review(lic.id), { decision: 'accept' })).status).toBe(404)
    // A document of another competition is not found through this one.
    const elsewhere = await scrutineer.post(`/api/competitions/${otherCompetitionId}/documents/${lic.id}/review`, { decision: 'accept' })
    expect(elsewhere.status).toBe(404)
    const still = await testDb()('documents').where({ id: lic.id }).first()
    expect(still.status).toBe('pending')
  })
})

describe('re-upload', () => {
  it('replaces the current document of its kind and keeps the old one in history', async () => {
    const before = await owner.get(docs())
    const rejected = before.body.current.find((d: { kind: string }) => d.kind === 'insurance')
    const res = await postForm(owner, docs(), { kind: 'insurance', expiresOn: '2028-01-31' }, { name: 'insurance-2.pdf', data: tinyPdf('New insurance') })
    expect(res.status).toBe(201)
    const after = await owner.get(docs())
    const current = after.body.current.find((d: { kind: string }) => d.kind === 'insurance')
    expect(current).toMatchObject({ id: res.body.document.id, status: 'pending', expiresOn: '2028-01-31' })
    expect(after.body.history).toEqual([expect.objectContaining({ id: rejected.id, status: 'rejected', superseded: true, replacedBy: res.body.document.id })])
    // The old file is still there to view.
    expect((await getBytes(scrutineer, `${docs()}/${rejected.id}/file`)).status).toBe(200)
    // A superseded document cannot be reviewed any more.
    const late = await scrutineer.post(`/api/competitions/${competitionId}/documents/${rejected.id}/review`, { decision: 'accept' })
    expect(late.status).toBe(409)
  })
})
