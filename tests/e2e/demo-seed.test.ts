// The demo seed gives the field README promises: 40 entries, and the seeded problems a
// scrutineer should find. Reads the throwaway database `npm test` seeded with the demo data.
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, testDb } from '../support/db'
import { DEMO_COMPETITION } from '../../seeds/demo-data'
import { SEEDED_PROBLEMS } from '../../seeds/demo-entries'

afterAll(closeTestDb)

async function demoEntry(compId: string) {
  const entry = await testDb()('entries as e')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .where({ 'c.slug': DEMO_COMPETITION.slug, 'e.comp_id': compId })
    .first('e.*')
  expect(entry, `entry ${compId}`).toBeTruthy()
  const units = await testDb()('units').where({ entry_id: entry.id })
    .select('kind', 'radio_id', testDb().raw(`to_char(firmware_expires_on, 'YYYY-MM-DD') as expires`), testDb().raw(`to_char(firmware_updated_on, 'YYYY-MM-DD') as updated`))
  return { entry, units }
}

describe('demo seed', () => {
  it('enters 40 gliders with unique competition IDs, each with a collision-warning unit but N1 (a seeded problem)', async () => {
    const rows = await testDb()('entries as e').join('competitions as c', 'c.id', 'e.competition_id')
      .where('c.slug', DEMO_COMPETITION.slug).select('e.id', 'e.comp_id')
    expect(rows).toHaveLength(40)
    expect(new Set(rows.map(r => r.comp_id)).size).toBe(40)
    const withUnit = await testDb()('units').whereIn('entry_id', rows.map(r => r.id)).where('kind', 'collision-warning').countDistinct('entry_id as n').first()
    expect(Number(withUnit!.n)).toBe(39)
    expect((await demoEntry('N1')).units.filter(u => u.kind === 'collision-warning')).toEqual([])
  })

  it('lists a reason for every seeded problem', () => {
    expect(Object.keys(SEEDED_PROBLEMS)).toEqual(expect.arrayContaining(['K7', 'T3', 'B2', 'M5', 'F9', 'R4', 'H8', 'D6', 'E2', 'S2', 'N1', 'P6']))
  })

  it('has firmware expiring during the contest on K7, and soon after it on T3', async () => {
    const k7 = await demoEntry('K7')
    const t3 = await demoEntry('T3')
    const k7Unit = k7.units.find(u => u.kind === 'collision-warning')!
    const t3Unit = t3.units.find(u => u.kind === 'collision-warning')!
    expect(k7Unit.expires > DEMO_COMPETITION.firstContestDay && k7Unit.expires <= DEMO_COMPETITION.lastContestDay).toBe(true)
    expect(t3Unit.expires > DEMO_COMPETITION.lastContestDay).toBe(true)
  })

  it('shares one radio ID between B2 and M5 only', async () => {
    const b2 = await demoEntry('B2')
    const m5 = await demoEntry('M5')
    const radio = b2.units.find(u => u.kind === 'collision-warning')!.radio_id
    expect(m5.units.find(u => u.kind === 'collision-warning')!.radio_id).toBe(radio)
    const sharing = await testDb()('units as u').join('competitions as c', 'c.id', 'u.competition_id')
      .where({ 'c.slug': DEMO_COMPETITION.slug, 'u.radio_id': radio }).count('* as n').first()
    expect(Number(sharing!.n)).toBe(2)
  })

  it('has F9 submitted but unpaid, R4 without a flight recorder, H8 not updated for over a year', async () => {
    const f9 = await demoEntry('F9')
    expect(f9.entry.status).toBe('submitted')
    expect(f9.entry.payment_status).toBe('unpaid')
    const r4 = await demoEntry('R4')
    expect(r4.units.filter(u => u.kind === 'flight-recorder')).toHaveLength(0)
    const h8 = await demoEntry('H8')
    expect(h8.units.find(u => u.kind === 'collision-warning')!.updated < '2026-07-12').toBe(true)
  })

  it('leaves the tenth demo entrant without an entry, to register from scratch', async () => {
    const count = await testDb()('entries as e').join('users as u', 'u.id', 'e.entrant_user_id')
      .where('u.email', 'entrant10@gridmark.example').count('* as n').first()
    expect(Number(count!.n)).toBe(0)
  })

  it('records a payment for every paid entry and a refund for the withdrawn one', async () => {
    const rows = await testDb()('entries as e').join('competitions as c', 'c.id', 'e.competition_id')
      .leftJoin('payments as p', 'p.entry_id', 'e.id')
      .where('c.slug', DEMO_COMPETITION.slug).whereIn('e.payment_status', ['paid', 'refunded'])
      .select('e.payment_status', 'e.paid_minor', 'p.status', 'p.amount_minor', 'p.refunded_minor')
    expect(rows.length).toBeGreaterThan(20)
    for (const r of rows) {
      expect(r.status).toBe(r.payment_status)
      expect(r.paid_minor).toBe(r.amount_minor - r.refunded_minor)
    }
  })

  it('has C4’s insurance rejected with a reason, and G5’s IGC declaration naming another glider', async () => {
    const c4 = await demoEntry('C4')
    const insurance = await testDb()('documents').where({ entry_id: c4.entry.id, kind: 'insurance', superseded: false }).first()
    expect(insurance.status).toBe('rejected')
    expect(insurance.review_reason).toMatch(/before the last contest day/)
    const g5 = await demoEntry('G5')
    const igc = await testDb()('igc_files').where({ entry_id: g5.entry.id, superseded: false }).first()
    expect(igc.glider_id).not.toBe(g5.entry.registration)
    expect(igc.declared_comp_id).not.toBe(g5.entry.comp_id)
    const a1 = await demoEntry('A1')
    const matching = await testDb()('igc_files').where({ entry_id: a1.entry.id, superseded: false }).first()
    expect(matching.glider_id).toBe(a1.entry.registration)
  })

  it('writes the demo IGC files as Gridmark’s parser reads them (IGC FR specification Appendix A: A, H and I records), sealed as the app seals files', async () => {
    const { parseIgc } = await import('../../server/domain/files/igc-header')
    const { fileKeyringFromEnv, open } = await import('../../server/domain/files/file-crypt')
    const { readFileSync } = await import('node:fs')
    const { join } = await import('node:path')
    const keyring = fileKeyringFromEnv()
    const read = async (compId: string) => {
      const { entry } = await demoEntry(compId)
      const igc = await testDb()('igc_files').where({ entry_id: entry.id, superseded: false }).orderBy('original_filename').first()
      const [, entryId, id] = igc.storage_key.split(':')
      const stored = readFileSync(join(process.env.NUXT_UPLOADS_DIR!, 'igc', entryId, id))
      expect(stored.includes(Buffer.from('HFPLTPILOTINCHARGE'))).toBe(false)
      const opened = open(stored, keyring)
      expect(opened.keyId).toBe(keyring.current!.id)
      expect(igc.file_key_id).toBe(keyring.current!.id)
      const parsed = parseIgc(opened.data.toString('latin1'))
      if (!parsed.ok) throw new Error(`${compId}'s demo file does not parse`)
      return { igc, header: parsed.header, errors: parsed.errors }
    }
    const g5 = await read('G5')
    expect(g5.errors).toEqual([])
    expect(g5.header.flightDate).toBe('2027-05-29')
    expect(g5.header).toMatchObject({ gliderId: g5.igc.glider_id, competitionId: g5.igc.declared_comp_id, competitionClass: g5.igc.declared_class, recorderId: g5.igc.recorder_id })
    const l8 = await read('L8')
    expect(l8.errors).toEqual([])
    expect(l8.header.extensions).toEqual(['FXA', 'SIU', 'ENL'])
    expect(l8.igc.extensions).toEqual(['FXA', 'SIU', 'ENL'])
    expect((await read('E2')).header.extensions).toEqual(['FXA', 'SIU'])
  })

  it('has a file for every flight recorder but S2’s second', async () => {
    const missing = await testDb()('units as u').join('entries as e', 'e.id', 'u.entry_id').join('competitions as c', 'c.id', 'e.competition_id')
      .where({ 'c.slug': DEMO_COMPETITION.slug, 'u.kind': 'flight-recorder' }).whereNot('e.status', 'draft')
      .whereNotExists(q => q.select(1).from('igc_files as f').whereRaw('f.unit_id = u.id and not f.superseded'))
      .select('e.comp_id')
    expect(missing.map(r => r.comp_id)).toEqual(['S2'])
  })
})
