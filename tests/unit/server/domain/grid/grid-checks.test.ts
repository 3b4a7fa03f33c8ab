// The pure parts of recording a grid check: the fingerprint a replay is compared by, the
// outcome rule, the stored answers against the checklist, the day window, the stored row →
// the record the API answers, the entry's tile inputs once the check is stored.
import { describe, expect, it } from 'vitest'
import { DEFAULT_CHECKLIST } from '#shared/constants/grid'
import type { GridCheckBody } from '#shared/schemas/grid'
import {
  canonicalJson, checkOutcome, gridCheckBodySha256, storedAnswers, toGridCheckRecord, toGridCheckSummary,
  withCheck, type GridCheckJoinedRow,
} from '#domain/grid/grid-checks'
import type { CheckRow, TileInputs } from '#domain/read-model/day-inputs'

const body: GridCheckBody = {
  idempotencyKey: '0b6f1c1e-6a8e-4a43-9a57-2d4f1c9e7a10',
  entryId: '6c7a9e52-1f0b-4c55-8d0e-3b1d2f4a5c6e',
  day: '2027-05-03',
  checkedAt: '2027-05-03T10:15:00+02:00',
  answers: [{ itemId: 'antennas', result: 'pass' }, { itemId: 'ballast', result: 'fail', note: 'Tail tank not empty' }],
  weighIn: { units: 'kg-m', readings: [{ point: 'main-wheel', weight: 480, arm: 0.1 }, { point: 'tail-wheel', weight: 30, arm: 4.4 }] },
  notes: 'Checked at the launch point',
  foundBy: 'scan',
}
const sha = (b: GridCheckBody, c = 'comp-1', s = 'user-1') => gridCheckBodySha256(b, c, s)

describe('the fingerprint of a grid check', () => {
  it('does not depend on the order of keys, at any level', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { z: 1, y: 2 }], c: null } })).toBe('{"a":{"c":null,"d":[1,{"y":2,"z":1}]},"b":1}')
    const reordered = JSON.parse(JSON.stringify(Object.fromEntries(Object.entries(body).reverse()))) as GridCheckBody
    reordered.weighIn = { readings: body.weighIn!.readings.map(r => ({ arm: r.arm, weight: r.weight, point: r.point })), units: 'kg-m' }
    expect(sha(reordered)).toBe(sha(body))
  })

  it('treats the same instant in another offset, and a left-out note, as the same check', () => {
    expect(sha({ ...body, checkedAt: '2027-05-03T08:15:00Z' })).toBe(sha(body))
    const withNote = { ...body, answers: [{ itemId: 'antennas', result: 'pass' as const, note: '' }, body.answers[1]!] }
    expect(sha(withNote)).toBe(sha(body))
    expect(sha({ ...body, weighIn: undefined })).toBe(sha({ ...body, weighIn: null }))
  })

  it('changes with any answer, the weigh-in, the competition or the scrutineer', () => {
    const base = sha(body)
    expect(sha({ ...body, answers: [{ itemId: 'antennas', result: 'fail' }, body.answers[1]!] })).not.toBe(base)
    expect(sha({ ...body, weighIn: null })).not.toBe(base)
    expect(sha({ ...body, checkedAt: '2027-05-03T10:16:00+02:00' })).not.toBe(base)
    expect(sha(body, 'comp-2')).not.toBe(base)
    expect(sha(body, 'comp-1', 'user-2')).not.toBe(base)
    expect(base).toMatch(/^[0-9a-f]{64}$/)
  })
})

describe('the outcome', () => {
  it('fails when any item failed, and passes otherwise, unanswered items included', () => {
    expect(checkOutcome([{ result: 'pass' }, { result: 'fail' }, { result: 'not-checked' }])).toBe('fail')
    expect(checkOutcome([{ result: 'pass' }, { result: 'not-checked' }])).toBe('pass')
    expect(checkOutcome([])).toBe('pass')
  })
})

describe('the stored answers', () => {
  it('hold every item of the checklist in its order with its label; the ones not answered as not checked', () => {
    const out = storedAnswers(DEFAULT_CHECKLIST, body.answers)
    expect('answers' in out).toBe(true)
    if (!('answers' in out)) return
    expect(out.answers.map(a => a.itemId)).toEqual(DEFAULT_CHECKLIST.map(i => i.id))
    expect(out.answers.find(a => a.itemId === 'ballast')).toEqual({ itemId: 'ballast', label: 'Ballast as declared', result: 'fail', note: 'Tail tank not empty' })
    expect(out.answers.filter(a => a.result === 'not-checked')).toHaveLength(DEFAULT_CHECKLIST.length - 2)
  })

  it('name an item that is not on the checklist, or one answered twice', () => {
    expect(storedAnswers(DEFAULT_CHECKLIST, [{ itemId: 'canopy', result: 'pass' }])).toEqual({ problem: { kind: 'unknown', itemId: 'canopy' } })
    expect(storedAnswers(DEFAULT_CHECKLIST, [{ itemId: 'antennas', result: 'pass' }, { itemId: 'antennas', result: 'fail' }]))
      .toEqual({ problem: { kind: 'duplicate', itemId: 'antennas' } })
  })
})

describe('the stored row → the API record', () => {
  const row: GridCheckJoinedRow = {
    id: 'g1', competition_id: 'comp-1', entry_id: 'e1', day: '2027-05-03', idempotency_key: body.idempotencyKey, body_sha256: 'x',
    scrutineer_id: 'user-1', checked_at: new Date('2027-05-03T08:15:00Z'), received_at: '2027-05-03T09:00:00.123Z',
    answers: [{ itemId: 'antennas', label: 'Antennas fitted', result: 'pass', note: '' }], notes: '', outcome: 'pass', readiness: 'ready',
    findings: [], found_by: null, comp_id: 'K7', scrutineer_name: 'Sam  van Scrutineer',
    weigh_units: 'kg-m', weigh_readings: [{ point: 'main-wheel', weight: 480, arm: 0.1 }], weigh_mass_kg: '480.00', weigh_cg_arm_m: '0.1000',
  }

  it('gives times as ISO, the scrutineer’s initials and the weigh-in as numbers', () => {
    const c = toGridCheckRecord(row)
    expect(c).toMatchObject({ compId: 'K7', checkedAt: '2027-05-03T08:15:00.000Z', receivedAt: '2027-05-03T09:00:00.123Z', foundBy: null })
    expect(c.scrutineer).toEqual({ id: 'user-1', name: 'Sam  van Scrutineer', initials: 'SS' })
    expect(c.weighIn).toEqual({ units: 'kg-m', readings: row.weigh_readings, massKg: 480, cgArmM: 0.1 })
    expect(toGridCheckRecord({ ...row, weigh_units: null, weigh_readings: null, weigh_mass_kg: null, weigh_cg_arm_m: null }).weighIn).toBeNull()
    expect(toGridCheckSummary(c)).toEqual({ id: 'g1', checkedAt: c.checkedAt, scrutineerName: 'Sam  van Scrutineer', scrutineerInitials: 'SS', outcome: 'pass', readiness: 'ready' })
  })
})

describe('the tile’s inputs once a check is stored', () => {
  const check = (entryId: string, checkedAt: string, outcome: 'pass' | 'fail' = 'pass'): CheckRow =>
    ({ entry_id: entryId, day: '2027-05-03', checked_at: checkedAt, outcome, answers: [], scrutineer_name: 'Sam Scrutineer' })
  // The latest stored check as the database reads it inside a JSON value: its text with an offset.
  const stored = check('e1', '2027-05-03T08:15:00.5+00:00', 'fail')
  const inputs: TileInputs = { checks: [stored, check('e2', '2027-05-03T07:00:00+00:00')], existing: [], entrants: [], class_orders: {}, seq: 41 }

  it('puts a later check in place of the entry’s latest, and leaves the other entries’ checks', () => {
    const later = check('e1', '2027-05-03T10:16:00+02:00')
    expect(withCheck(inputs, later)).toEqual({ ...inputs, checks: [later, inputs.checks[1]] })
  })

  it('keeps the latest when the check stored now was made earlier (queued offline), and takes the first check of an entry', () => {
    expect(withCheck(inputs, check('e1', '2027-05-03T08:15:00.499Z'))).toBe(inputs)
    const first = check('e3', '2027-05-03T06:00:00Z')
    expect(withCheck(inputs, first)!.checks).toEqual([...inputs.checks, first])
  })

  it('leaves the order to the stored rows when both were made at the same instant', () => {
    expect(withCheck(inputs, check('e1', '2027-05-03T10:15:00.500+02:00'))).toBeUndefined()
  })
})
