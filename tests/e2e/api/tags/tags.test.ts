/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Glider tags through the built server and the real PostgreSQL: issuing for a class or chosen
// entries, reissue and revoke (the old sticker stops working), the printable sheet and its
// PDF, resolving a scanned token or a typed short code, and who may do each.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { auditRows, entriesWorld, type EntriesWorld } from '../../../support/entries'
import { DEMO_COMPETITION, DEMO_PASSWORD } from '../../../../seeds/demo-data'
import { createTagToken, tagTokenFromNonce } from '#domain/tags/tag-token'
import { SHORT_CODE_ALPHABET } from '../../../../shared/constants/grid'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

// The server signs with NUXT_TAG_SECRET, else the session password; `npm test` hands both on.
const secret = () => process.env.NUXT_TAG_SECRET || process.env.NUXT_SESSION_PASSWORD!

let w: EntriesWorld
let director: Awaited<ReturnType<typeof signedUpClient>>
let base: string
let own: string // the entrant's accepted entry, class Standard
let second: string // another accepted entry, class Standard
let club: string // an accepted entry of class Club
let submitted: string
let othersEntry: string // the other entrant's accepted entry

const tokenOf = (url: string) => url.split('/t/')[1]!

async function sheet(query = '') {
  const res = await w.organiser.client.get(`${base}/tags/sheet${query}`)
  expect(res.status).toBe(200)
  return res.body.tags as any[]
}

beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Tags Cup')
  director = await signedUpClient(baseUrl, 'Dana Director')
  await testDb()('memberships').insert([
    { user_id: director.user.id, competition_id: w.competitionId, role: 'director' },
    { user_id: w.entrant.user.id, competition_id: w.competitionId, role: 'entrant' },
    { user_id: w.otherEntrant.user.id, competition_id: w.competitionId, role: 'entrant' },
  ])
  base = `/api/competitions/${w.competitionId}`
  const arrange = (entrantUserId: string, classId: string, compId: string, status = 'accepted') =>
    createEntry({ competitionId: w.competitionId, classId, entrantUserId, compId, status })
  own = await arrange(w.entrant.user.id, w.classId, 'T1')
  second = await arrange(w.entrant.user.id, w.classId, 'T2')
  club = await arrange(w.otherEntrant.user.id, w.otherClassId, 'C1')
  submitted = await arrange(w.entrant.user.id, w.classId, 'S1', 'submitted')
  othersEntry = club
})

describe('issuing tags', () => {
  it('lists accepted entries only, each without a tag yet', async () => {
    const res = await w.organiser.client.get(`${base}/tags`)
    expect(res.status).toBe(200)
    const ids = res.body.entries.map((e: any) => e.entryId)
    expect(ids).toEqual(expect.arrayContaining([own, second, club]))
    expect(ids).not.toContain(submitted)
    expect(res.body.entries.every((e: any) => e.tag === null)).toBe(true)
  })

  it('refuses a chosen entry that is not accepted (409), and changes nothing', async () => {
    const res = await w.organiser.client.post(`${base}/tags`, { entryIds: [own, submitted] })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe(MESSAGES.tagEntryNotAccepted)
    expect(await testDb()('tags').where({ competition_id: w.competitionId }).count('* as n').first()).toMatchObject({ n: '0' })
  })

  it('refuses a bad selection with 400, an unknown class or entry with 404', async () => {
    expect((await w.organiser.client.post(`${base}/tags`, { classId: w.classId, entryIds: [own] })).status).toBe(400)
    expect((await w.organiser.client.post(`${base}/tags`, { entryIds: [] })).status).toBe(400)
    expect((await w.organiser.client.post(`${base}/tags`, { entryIds: ['nope'] })).status).toBe(400)
    expect((await w.organiser.client.postRaw(`${base}/tags`, '{oops')).status).toBe(400)
    expect((await w.organiser.client.post(`${base}/tags`, { classId: '00000000-0000-4000-8000-000000000000' })).status).toBe(404)
    expect((await w.organiser.client.post(`${base}/tags`, { entryIds: ['00000000-0000-4000-8000-000000000000'] })).status).toBe(404)
  })

  it('issues for a class: the accepted entries of that class get a tag, the submitted one is skipped; audited', async () => {
    const res = await w.organiser.client.post(`${base}/tags`, { classId: w.classId })
    expect(res.status).toBe(201)
    expect(res.body.entries.map((e: any) => e.entryId).sort()).toEqual([own, second].sort())
    for (const e of res.body.entries) {
      expect(e.tag.shortCode).toMatch(new RegExp(`^[${SHORT_CODE_ALPHABET}]{8}$`))
      expect(Number.isNaN(Date.parse(e.tag.issuedAt))).toBe(false)
    }
    expect(await testDb()('tags').where({ entry_id: submitted }).first()).toBeUndefined()
    expect(await testDb()('tags').where({ entry_id: club }).first()).toBeUndefined()
    expect(await auditRows(own, 'tag.issued')).toHaveLength(1)
  })

  it('keeps the tag of an entry that already has one when issuing again (all accepted)', async () => {
    const before = (await w.organiser.client.get(`${base}/tags`)).body.entries.find((e: any) => e.entryId === own).tag
    const res = await w.organiser.client.post(`${base}/tags`, {})
    expect(res.status).toBe(201)
    expect(res.body.entries.find((e: any) => e.entryId === own).tag).toEqual(before)
    expect(res.body.entries.find((e: any) => e.entryId === club).tag).not.toBeNull()
    expect(await testDb()('tags').where({ entry_id: own }).count('* as n').first()).toMatchObject({ n: '1' })
    expect(await auditRows(own, 'tag.issued')).toHaveLength(1)
  })

  it('lets only the organiser issue: scrutineer and director 403, entrant 403, outsider 404, anonymous 401', async () => {
    expect((await w.scrutineer.client.post(`${base}/tags`, {})).status).toBe(403)
    expect((await director.client.post(`${base}/tags`, {})).status).toBe(403)
    expect((await w.entrant.client.post(`${base}/tags`, {})).status).toBe(403)
    expect((await w.outsider.client.post(`${base}/tags`, {})).status).toBe(404)
    expect((await w.anonymous.post(`${base}/tags`, {})).status).toBe(401)
    expect((await w.scrutineer.client.get(`${base}/tags`)).status).toBe(403)
  })
})

describe('the sheet', () => {
  it('gives each current tag with the URL its QR code carries and an SVG of the QR code', async () => {
    const tags = await sheet(`?classId=${w.classId}`)
    expect(tags.map(t => t.entryId).sort()).toEqual([own, second].sort())
    const t1 = tags.find(t => t.entryId === own)
    expect(t1).toMatchObject({ compId: 'T1', className: 'Standard' })
    expect(t1.url).toMatch(new RegExp(`^https?://[^/]+/t/[\\w-]{43}$`))
    expect(t1.qrSvg).toMatch(/^<svg[\s\S]*<\/svg>\s*$/)
    // The token is the contract's: the stored nonce signed for this competition, and only its hash stored.
    const row = await testDb()('tags').where({ entry_id: own }).whereNull('revoked_at').first()
    expect(tokenOf(t1.url)).toBe(tagTokenFromNonce(secret(), w.competitionId, row.nonce))
    expect(JSON.stringify(row)).not.toContain(tokenOf(t1.url))
    expect(row.short_code).toBe(t1.tag.shortCode)

    const chosen = await sheet(`?entryIds=${club},${own}`)
    expect(chosen.map(t => t.entryId).sort()).toEqual([club, own].sort())
    expect((await w.organiser.client.get(`${base}/tags/sheet?entryIds=nope`)).status).toBe(400)
    expect((await w.scrutineer.client.get(`${base}/tags/sheet`)).status).toBe(403)
  })

  it('prints an A4 PDF of the selection', async () => {
    const res = await fetch(`${baseUrl}${base}/tags/sheet.pdf?classId=${w.classId}`, { headers: { cookie: w.organiser.client.cookie } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="tags-tags-cup-[\w-]+\.pdf"/)
    const pdf = Buffer.from(await res.arrayBuffer())
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-')
    expect(pdf.length).toBeGreaterThan(2000)
    const text = pdf.toString('latin1')
    expect(text).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/)
    expect((await fetch(`${baseUrl}${base}/tags/sheet.pdf`, { headers: { cookie: w.scrutineer.client.cookie } })).status).toBe(403)
  })
})

describe('resolving a tag', () => {
  let token: string
  let code: string
  beforeAll(async () => {
    const t = (await sheet(`?entryIds=${own}`))[0]
    token = tokenOf(t.url)
    code = t.tag.shortCode
  })

  it('leads staff to the grid check and the own entrant to their entry', async () => {
    const expected = { competitionId: w.competitionId, entryId: own, compId: 'T1' }
    for (const staff of [w.organiser, director, w.scrutineer]) {
      const res = await staff.client.get(`/api/tags/${token}`)
      expect(res.status).toBe(200)
      expect(res.body).toEqual({ ...expected, view: 'grid' })
    }
    const mine = await w.entrant.client.get(`/api/tags/${token}`)
    expect(mine.status).toBe(200)
    expect(mine.body).toEqual({ ...expected, view: 'own' })
  })

  it('tells another entrant and an outsider only that the tag is unknown; asks the anonymous to sign in', async () => {
    for (const other of [w.otherEntrant, w.outsider]) {
      const res = await other.client.get(`/api/tags/${token}`)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe(MESSAGES.tagNotFound)
    }
    expect((await w.anonymous.get(`/api/tags/${token}`)).status).toBe(401)
  })

  it('refuses forged, truncated and other-competition tokens with 404', async () => {
    const forged = token.slice(0, -2) + (token.endsWith('AA') ? 'BB' : 'AA')
    const row = await testDb()('tags').where({ entry_id: own }).whereNull('revoked_at').first()
    const otherCompetition = await createCompetition('Tags Elsewhere', [{ userId: w.organiser.user.id, role: 'organiser' }])
    const moved = tagTokenFromNonce(secret(), otherCompetition, row.nonce)
    const unknown = createTagToken(secret(), w.competitionId).token
    for (const bad of [forged, token.slice(0, 42), `${token}x`, moved, unknown, 'not-a-tag']) {
      const res = await w.organiser.client.get(`/api/tags/${encodeURIComponent(bad)}`)
      expect(res.status, bad).toBe(404)
      expect(res.body.message).toBe(MESSAGES.tagNotFound)
    }
  })

  it('resolves a typed short code in lower case with a dash', async () => {
    const typed = `${code.slice(0, 4)}-${code.slice(4)}`.toLowerCase()
    const res = await w.scrutineer.client.get(`${base}/tags/by-code/${typed}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ entryId: own, view: 'grid' })
    expect((await w.entrant.client.get(`${base}/tags/by-code/${typed}`)).body).toMatchObject({ entryId: own, view: 'own' })
    const other = await w.otherEntrant.client.get(`${base}/tags/by-code/${typed}`)
    expect(other.status).toBe(404)
    expect(other.body.message).toBe(MESSAGES.shortCodeNotFound)
    expect((await w.outsider.client.get(`${base}/tags/by-code/${typed}`)).status).toBe(404)
    expect((await w.anonymous.get(`${base}/tags/by-code/${typed}`)).status).toBe(401)
    const unknown = await w.scrutineer.client.get(`${base}/tags/by-code/${code === 'AAAAAAAA' ? 'CCCCCCCC' : 'AAAAAAAA'}`)
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toBe(MESSAGES.shortCodeNotFound)
    expect((await w.scrutineer.client.get(`${base}/tags/by-code/0000-0000`)).status).toBe(404)
  })
})

describe('reissue and revoke', () => {
  it('reissues: a new tag and short code; the old token and code answer 404 with the revoked message; audited', async () => {
    const old = (await sheet(`?entryIds=${second}`))[0]
    const res = await w.organiser.client.post(`${base}/entries/${second}/tag/reissue`)
    expect(res.status).toBe(200)
    expect(res.body.entryId).toBe(second)
    expect(res.body.tag.id).not.toBe(old.tag.id)
    expect(res.body.tag.shortCode).not.toBe(old.tag.shortCode)

    const stale = await w.scrutineer.client.get(`/api/tags/${tokenOf(old.url)}`)
    expect(stale.status).toBe(404)
    expect(stale.body.message).toBe(MESSAGES.tagRevoked)
    const staleCode = await w.scrutineer.client.get(`${base}/tags/by-code/${old.tag.shortCode}`)
    expect(staleCode.status).toBe(404)
    expect(staleCode.body.message).toBe(MESSAGES.tagRevoked)
    // Someone with no right to the entry learns nothing, not even that the tag was revoked.
    expect((await w.otherEntrant.client.get(`/api/tags/${tokenOf(old.url)}`)).body.message).toBe(MESSAGES.tagNotFound)

    const fresh = (await sheet(`?entryIds=${second}`))[0]
    expect((await w.scrutineer.client.get(`/api/tags/${tokenOf(fresh.url)}`)).body).toMatchObject({ entryId: second, view: 'grid' })
    const [audit] = await auditRows(second, 'tag.reissued')
    expect(audit.details).toMatchObject({ tagId: res.body.tag.id, revokedTagId: old.tag.id })
    expect(await testDb()('tags').where({ entry_id: second }).whereNull('revoked_at').count('* as n').first()).toMatchObject({ n: '1' })
  })

  it('revokes without a new tag; a second revoke is refused with 409; audited', async () => {
    const old = (await sheet(`?entryIds=${othersEntry}`))[0]
    const res = await w.organiser.client.post(`${base}/entries/${othersEntry}/tag/revoke`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ entryId: othersEntry, tag: null })
    expect((await w.organiser.client.get(`/api/tags/${tokenOf(old.url)}`)).body.message).toBe(MESSAGES.tagRevoked)
    const again = await w.organiser.client.post(`${base}/entries/${othersEntry}/tag/revoke`)
    expect(again.status).toBe(409)
    expect(again.body.message).toBe(MESSAGES.tagNoneToRevoke)
    expect(await auditRows(othersEntry, 'tag.revoked')).toHaveLength(1)
    expect(await sheet(`?entryIds=${othersEntry}`)).toEqual([])
  })

  it('refuses reissue for an entry that is not accepted (409), of another competition (404), and to non-organisers', async () => {
    expect((await w.organiser.client.post(`${base}/entries/${submitted}/tag/reissue`)).status).toBe(409)
    const elsewhere = await createCompetition('Tags Other', [{ userId: w.organiser.user.id, role: 'organiser' }])
    const foreign = await createEntry({ competitionId: elsewhere, classId: await createClass(elsewhere), entrantUserId: w.entrant.user.id, status: 'accepted' })
    expect((await w.organiser.client.post(`${base}/entries/${foreign}/tag/reissue`)).status).toBe(404)
    expect((await w.organiser.client.post(`${base}/entries/not-an-id/tag/reissue`)).status).toBe(404)
    expect((await w.scrutineer.client.post(`${base}/entries/${own}/tag/reissue`)).status).toBe(403)
    expect((await w.entrant.client.post(`${base}/entries/${own}/tag/revoke`)).status).toBe(403)
    expect((await w.anonymous.post(`${base}/entries/${own}/tag/revoke`)).status).toBe(401)
  })
})

describe('the demo seed', () => {
  it('gives each accepted demo entry exactly one current tag, issued by the organiser, that resolves', async () => {
    const competition = await testDb()('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    const accepted = await testDb()('entries').where({ competition_id: competition.id, status: 'accepted' }).select('id')
    expect(accepted.length).toBeGreaterThan(0)
    const tags = await testDb()('tags as t').join('users as u', 'u.id', 't.issued_by')
      .where('t.competition_id', competition.id).whereNull('t.revoked_at').select('t.entry_id', 't.short_code', 'u.email')
    expect(tags.map(t => t.entry_id).sort()).toEqual(accepted.map(a => a.id).sort())
    expect(tags.every(t => t.email === 'organiser@gridmark.example')).toBe(true)
    expect(tags.every(t => new RegExp(`^[${SHORT_CODE_ALPHABET}]{8}$`).test(t.short_code))).toBe(true)

    // Signed with the server's key: the organiser's sheet gives a token the scrutineer's scan resolves.
    const organiser = new ApiClient(baseUrl)
    const scrutineer = new ApiClient(baseUrl)
    expect((await organiser.post('/api/auth/login', { email: 'organiser@gridmark.example', password: DEMO_PASSWORD })).status).toBe(200)
    expect((await scrutineer.post('/api/auth/login', { email: 'scrutineer@gridmark.example', password: DEMO_PASSWORD })).status).toBe(200)
    const first = tags[0]!
    const printed = await organiser.get(`/api/competitions/${competition.id}/tags/sheet?entryIds=${first.entry_id}`)
    expect(printed.body.tags).toHaveLength(1)
    const scanned = await scrutineer.get(`/api/tags/${tokenOf(printed.body.tags[0].url)}`)
    expect(scanned.status).toBe(200)
    expect(scanned.body).toMatchObject({ entryId: first.entry_id, view: 'grid' })
    const typed = await scrutineer.get(`/api/competitions/${competition.id}/tags/by-code/${first.short_code}`)
    expect(typed.body).toMatchObject({ entryId: first.entry_id, view: 'grid' })
  })
})
