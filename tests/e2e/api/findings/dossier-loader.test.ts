// loadCompetitionDossiers reads some entries' dossiers (a grid check's, a director's action's,
// an entry page's) or a whole competition's in one statement, scoped in SQL: a few entries'
// must be the whole competition's narrowed to them — the same rows, dossiers and field. Read in PostgreSQL against the demo competition
// (documents, IGC files, the seeded problems, entries in every state) and against a
// competition with grid checks and weigh-ins on two days.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { loadCompetitionDossiers, type CompetitionDossiers, type DossierScope } from '#domain/read-model/dossiers'
import { DEMO_COMPETITION } from '../../../../seeds/demo-data'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

/** The whole competition's read, narrowed to `ids`, is what reading only `ids` gives. */
async function expectScopedLikeWhole(competitionId: string, ids: string[], scope: Omit<DossierScope, 'entryIds'> = {}): Promise<CompetitionDossiers> {
  const whole = (await loadCompetitionDossiers(competitionId, scope, testDb()))!
  const some = (await loadCompetitionDossiers(competitionId, { ...scope, entryIds: ids }, testDb()))!
  expect(some.competitionRow).toEqual(whole.competitionRow)
  expect(some.competition).toEqual(whole.competition)
  expect(some.field).toEqual(whole.field)
  const kept = whole.rows.map((row, i) => ({ row, dossier: whole.dossiers[i]! })).filter(x => ids.includes(x.row.id))
  expect(some.rows).toEqual(kept.map(x => x.row))
  expect(some.dossiers).toEqual(kept.map(x => x.dossier))
  return some
}

describe('a few entries’ dossiers read in one statement', () => {
  let demoId: string
  let demoEntries: { id: string, status: string }[]
  beforeAll(async () => {
    demoId = (await testDb()('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')).id
    demoEntries = await testDb()('entries').where({ competition_id: demoId }).orderBy('comp_id').select('id', 'status')
  })

  it('are the whole competition’s, entry by entry, for every entry of the demo', async () => {
    expect(new Set(demoEntries.map(e => e.status)).size).toBeGreaterThan(2)
    for (const e of demoEntries) {
      const some = await expectScopedLikeWhole(demoId, [e.id])
      expect(some.dossiers).toHaveLength(1)
    }
  })

  it('are the whole competition’s for several at once, and for the accepted ones only', async () => {
    const ids = demoEntries.filter((_, i) => i % 3 === 0).map(e => e.id)
    const all = await expectScopedLikeWhole(demoId, ids)
    expect(all.dossiers.some(d => d.documents.length > 0)).toBe(true)
    expect(all.dossiers.some(d => d.igcFiles.length > 0)).toBe(true)
    const accepted = await expectScopedLikeWhole(demoId, ids, { acceptedOnly: true })
    expect(accepted.rows.every(r => r.status === 'accepted')).toBe(true)
    expect(accepted.rows.length).toBeLessThan(all.rows.length)
  })

  it('answer an unknown entry, or another competition’s, with no dossier; an unknown competition with nothing', async () => {
    const w = await gridWorld(baseUrl, 'Loader Elsewhere Cup')
    const elsewhere = await gridEntry(w)
    const some = (await loadCompetitionDossiers(demoId, { entryIds: [elsewhere, '00000000-0000-4000-8000-000000000000'] }, testDb()))!
    expect(some.rows).toEqual([])
    expect(some.dossiers).toEqual([])
    expect(await loadCompetitionDossiers('00000000-0000-4000-8000-000000000000', { entryIds: [elsewhere] }, testDb())).toBeUndefined()
  })

  describe('on a day with grid checks and weigh-ins', () => {
    let w: GridWorld
    const ids: string[] = []
    const today = todayIn()
    beforeAll(async () => {
      w = await gridWorld(baseUrl, 'Loader Weigh-in Cup')
      for (let i = 0; i < 4; i++) ids.push(await gridEntry(w))
      const path = `${w.base}/grid-checks`
      const post = async (body: Record<string, unknown>) => expect((await w.scrutineer.client.post(path, body)).status).toBe(201)
      const kg = { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 430, arm: 0.1 }, { point: 'tail-wheel', weight: 30, arm: 4.5 }] }
      const lb = { units: 'lb-in', readings: [{ point: 'main-wheel', weight: 1000, arm: 4 }, { point: 'tail-skid', weight: 100, arm: 180 }] }
      // Yesterday's weigh-in and today's two checks of one glider, the later one sent first.
      await post(checkBody(ids[0]!, { day: shiftDay(today, -1), weighIn: lb }))
      await post(checkBody(ids[0]!, { checkedAt: new Date(Date.now() - 60_000).toISOString(), weighIn: kg }))
      await post(checkBody(ids[0]!, { checkedAt: new Date(Date.now() - 600_000).toISOString(), answers: [{ itemId: 'antennas', result: 'fail' }], weighIn: lb }))
      await post(checkBody(ids[1]!, { answers: [{ itemId: 'antennas', result: 'fail' }] }))
      // A withdrawn entry sharing a radio ID with an accepted one, and a unit without one.
      const radio = await testDb()('units').where({ entry_id: ids[1], kind: 'collision-warning' }).first('radio_id')
      await testDb()('units').where({ entry_id: ids[2], kind: 'collision-warning' }).update({ radio_id: radio.radio_id })
      await testDb()('entries').where({ id: ids[2] }).update({ status: 'withdrawn' })
      await testDb()('units').where({ entry_id: ids[3], kind: 'collision-warning' }).update({ radio_id: null })
    })

    it('carry the day’s latest check and every weigh-in in order, as the whole read does', async () => {
      const some = await expectScopedLikeWhole(w.competitionId, ids, { day: today })
      const first = some.dossiers.find(d => d.entry.id === ids[0])!
      expect(first.weighIns).toHaveLength(3)
      expect(first.gridCheck).toMatchObject({ day: today, outcome: 'pass' })
      expect(some.dossiers.find(d => d.entry.id === ids[1])!.gridCheck).toMatchObject({ day: today, outcome: 'fail' })
      expect(Object.keys(some.field.entries)).not.toContain(ids[2])
      for (const id of ids) await expectScopedLikeWhole(w.competitionId, [id], { day: today, acceptedOnly: true })
      await expectScopedLikeWhole(w.competitionId, ids, { day: shiftDay(today, -1) })
    })
  })
})
