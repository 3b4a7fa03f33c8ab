// The tag page a phone's camera opens (/t/<token>): a known tag leads on to its glider; an
// unknown, forged or revoked one answers HTTP 404 with its friendly words, not a 200.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { randomBytes } from 'node:crypto'
import type { ApiClient } from '../../../support/api'
import { closeTestDb, createEntry } from '../../../support/db'
import { entriesWorld, type EntriesWorld } from '../../../support/entries'
import { createTagToken } from '#domain/tags/tag-token'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: EntriesWorld
let entryId: string
let currentToken: string
let revokedToken: string
const tokenOf = (url: string) => url.split('/t/')[1]!

/** A plain GET of the page, as a browser sends it, with the client's session. */
async function page(client: ApiClient, token: string) {
  const res = await fetch(`${baseUrl}/t/${token}`, {
    headers: { accept: 'text/html', cookie: client.cookie, 'x-forwarded-for': client.address },
    redirect: 'manual',
  })
  return { status: res.status, html: await res.text() }
}

beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Tag Page Cup')
  entryId = await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId: 'TP', status: 'accepted' })
  const base = `/api/competitions/${w.competitionId}`
  expect((await w.organiser.client.post(`${base}/tags`, { entryIds: [entryId] })).status).toBe(201)
  const sheet = async () => (await w.organiser.client.get(`${base}/tags/sheet?entryIds=${entryId}`)).body.tags[0].url as string
  revokedToken = tokenOf(await sheet())
  expect((await w.organiser.client.post(`${base}/entries/${entryId}/tag/reissue`)).status).toBe(200)
  currentToken = tokenOf(await sheet())
})

describe('the tag page', () => {
  it('answers 200 for a current tag: the page opens and leads on to the glider', async () => {
    const res = await page(w.scrutineer.client, currentToken)
    expect(res.status).toBe(200)
    expect(res.html).toContain('Opening the glider this tag belongs to')
    expect(res.html).not.toContain(MESSAGES.tagNotFound.slice(0, 40))
  })

  it('answers 404 with the friendly page for a forged, a revoked and a malformed tag', async () => {
    const forged = createTagToken(randomBytes(32).toString('hex'), w.competitionId).token
    const cases: [string, string][] = [
      [forged, MESSAGES.tagNotFound],
      [revokedToken, MESSAGES.tagRevoked],
      ['not-a-tag', 'This is not a Gridmark tag.'],
    ]
    for (const [token, words] of cases) {
      const res = await page(w.scrutineer.client, token)
      expect(res.status, token).toBe(404)
      expect(res.html).toContain(words.slice(0, 40))
      expect(res.html).toContain('Go to your competitions')
    }
  })

  it('answers 404 to someone with no right to the glider, telling them nothing more', async () => {
    const res = await page(w.outsider.client, currentToken)
    expect(res.status).toBe(404)
    expect(res.html).toContain(MESSAGES.tagNotFound.slice(0, 40))
  })
})
