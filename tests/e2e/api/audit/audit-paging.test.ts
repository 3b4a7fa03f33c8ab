/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The audit log read in pages of 50, newest first, by a (time, id) cursor: every row once across
// the pages even where rows share a time, the filters combining with the cursor, and a bad
// cursor refused in words.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { competitionWithRoles, type RoleClients } from '../../../support/setup'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let t: RoleClients
let base: string
const TOTAL = 130

beforeAll(async () => {
  t = await competitionWithRoles(baseUrl, 'Audit Paging Cup')
  base = `/api/competitions/${t.competitionId}/audit`
  // Invented history: three rows a second (so times repeat), every fifth a hold.
  const start = Date.parse('2027-05-01T08:00:00.000Z')
  await testDb()('audit_log').insert(Array.from({ length: TOTAL }, (_, i) => ({
    at: new Date(start + Math.floor(i / 3) * 1000),
    actor_user_id: t.ids.director,
    competition_id: t.competitionId,
    action: i % 5 === 0 ? 'director.hold' : 'grid-check.recorded',
    subject_type: 'entry',
    subject_id: null,
    details: { n: i, reason: `Invented reason number ${i}` },
  })))
})

async function allPages(query: string) {
  const seen: any[] = []
  let before: string | null = null
  let pages = 0
  do {
    const res: any = await t.director.get(`${base}?${query}${before ? `&before=${encodeURIComponent(before)}` : ''}`)
    expect(res.status).toBe(200)
    seen.push(...res.body.rows)
    before = res.body.nextBefore
    pages++
  } while (before && pages < 10)
  return { seen, pages }
}

describe('audit log pages', () => {
  it('answers the newest 50 rows first, with a cursor to the next page', async () => {
    const res = await t.organiser.get(base)
    expect(res.status).toBe(200)
    expect(res.body.rows).toHaveLength(50)
    expect(res.body.rows[0].details.n).toBe(TOTAL - 1)
    expect(res.body.nextBefore).toMatch(/^2027-05-01T08:\d{2}:\d{2}\.\d{6}Z_\d+$/)

    const next = await t.organiser.get(`${base}?before=${encodeURIComponent(res.body.nextBefore)}`)
    expect(next.status).toBe(200)
    expect(next.body.rows).toHaveLength(50)
    expect(next.body.rows[0].details.n).toBe(TOTAL - 51)
  })

  it('follows the cursor to the end: every row once, newest first, though times repeat', async () => {
    const { seen, pages } = await allPages('')
    expect(pages).toBe(3)
    expect(seen.map(r => r.details.n)).toEqual(Array.from({ length: TOTAL }, (_, i) => TOTAL - 1 - i))
  })

  it('keeps the filters on every page', async () => {
    const { seen } = await allPages(`action=director.hold&actorId=${t.ids.director}&limit=10`)
    expect(seen).toHaveLength(TOTAL / 5)
    expect(seen.every(r => r.action === 'director.hold')).toBe(true)
    expect(new Set(seen.map(r => r.id)).size).toBe(seen.length)
  })

  it('refuses a bad cursor with a 400 in words', async () => {
    for (const bad of ['42', 'yesterday', '2027-13-45T99:00:00Z_1', '2027-02-30T08:00:00Z_1', '2027-05-01T08:00:00Z_', `2027-05-01T08:00:00Z_${'9'.repeat(20)}`]) {
      const res = await t.director.get(`${base}?before=${encodeURIComponent(bad)}`)
      expect(res.status, bad).toBe(400)
      expect(res.body.data.fieldErrors.before[0]).toBe('This page link of the audit log is not valid: start again from the newest rows.')
    }
  })
})
