// Invariants of the engine, over generated dossiers (fast-check).
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { buildField } from '#shared/engine/field'
import { evaluate } from '#shared/engine/evaluate'
import { applyWaivers, readiness, type DirectorAction } from '#shared/engine/readiness'
import type { Dossier, EngineUnit, ScaleReading } from '#shared/engine/types'
import { massAndArm, takeOffMass, weighIn } from '#shared/engine/weigh-in'
import { CATALOGUE } from '#shared/engine/catalogue'
import { competition, dossier } from './builders'

const date = fc.integer({ min: 0, max: 1200 }).map(n => new Date(Date.UTC(2026, 0, 1 + n)).toISOString().slice(0, 10))
const hex6 = fc.stringMatching(/^[0-9A-F]{6}$/)

const unit: fc.Arbitrary<EngineUnit> = fc.oneof(
  fc.record({
    id: fc.uuid(), kind: fc.constant('collision-warning' as const), model: fc.constantFrom('Lapwing CW', 'Curlew CX'),
    radioId: fc.option(hex6, { nil: null }), firmwareVersion: fc.constantFrom('7.20', '7.24', '3.1'),
    firmwareExpiresOn: fc.option(date, { nil: null }), firmwareUpdatedOn: fc.option(date, { nil: null }), obstacleDbExpiresOn: fc.option(date, { nil: null }),
  }),
  fc.record({
    id: fc.uuid(), kind: fc.constant('flight-recorder' as const), model: fc.constant('Plover FR-2'), serial: fc.string({ minLength: 1, maxLength: 6 }),
    approvalLevel: fc.constantFrom('all-flights', 'badges-up-to-diamonds', 'badges-up-to-gold', 'not-approved'),
  }),
)

const reading: fc.Arbitrary<ScaleReading> = fc.record({
  point: fc.constantFrom('main-wheel', 'tail-wheel', 'tail-skid', 'nose-wheel'),
  weight: fc.double({ min: 0, max: 600, noNaN: true }),
  arm: fc.double({ min: -2, max: 6, noNaN: true }),
})

const anyDossier: fc.Arbitrary<Dossier> = fc.record({
  units: fc.array(unit, { maxLength: 4 }),
  paid: fc.constantFrom('paid', 'unpaid', 'refunded'),
  readings: fc.array(reading, { maxLength: 3 }),
  compId: fc.constantFrom('A1', 'B2', 'K7'),
  mtomKg: fc.option(fc.integer({ min: 300, max: 850 }), { nil: null }),
}).map(g => dossier({
  units: g.units,
  payment: { status: g.paid as 'paid' },
  weighIns: g.readings.length ? [{ weighedOn: '2027-07-12', units: 'kg-m', readings: g.readings }] : [],
}, { compId: g.compId, mtomKg: g.mtomKg, cgForwardLimitM: 0.2, cgAftLimitM: 0.4 }))

const comp = competition()

describe('engine invariants', () => {
  it('evaluation is deterministic: the same dossier gives the same findings, in the same order', () => {
    fc.assert(fc.property(fc.array(anyDossier, { minLength: 1, maxLength: 4 }), (ds) => {
      const withIds = ds.map((d, i) => ({ ...d, entry: { ...d.entry, id: `e${i}` } }))
      const field = buildField(withIds)
      const again = buildField(structuredClone(withIds))
      for (const d of withIds) expect(evaluate(structuredClone(d), comp, again)).toEqual(evaluate(d, comp, field))
    }))
  })

  it('a dossier with no units yields the unit findings: the missing recorder, and nothing about any unit', () => {
    fc.assert(fc.property(anyDossier, (d) => {
      const bare = { ...d, units: [] }
      const findings = evaluate(bare, comp, buildField([bare]))
      expect(findings.map(f => f.checkId)).toContain('recorder.present')
      expect(findings.filter(f => f.unitId !== undefined)).toEqual([])
    }))
  })

  it('adding a waiver never adds a finding, nor worsens readiness', () => {
    const rank = { ready: 0, caution: 1, unchecked: 2, held: 3 }
    const waiver: fc.Arbitrary<DirectorAction> = fc.record({
      kind: fc.constant('waiver' as const),
      day: fc.constantFrom(null, '2027-07-12', '2027-07-13'),
      checkId: fc.constantFrom(...CATALOGUE.map(c => c.id)),
    })
    fc.assert(fc.property(anyDossier, fc.array(waiver, { maxLength: 3 }), waiver, fc.boolean(), (d, before, added, checked) => {
      const findings = evaluate(d, comp, buildField([d]))
      const day = '2027-07-12'
      const a = applyWaivers(findings, before, day)
      const b = applyWaivers(findings, [...before, added], day)
      expect(b.length).toBeLessThanOrEqual(a.length)
      for (const f of b) expect(a).toContainEqual(f)
      const grid = checked ? { day, outcome: 'pass' as const } : null
      expect(rank[readiness(findings, grid, [...before, added], day)]).toBeLessThanOrEqual(rank[readiness(findings, grid, before, day)])
    }))
  })

  it('mass is the sum of the readings, in kg and converted from lb', () => {
    fc.assert(fc.property(fc.array(reading, { maxLength: 5 }), (rs) => {
      const sum = rs.reduce((s, r) => s + r.weight, 0)
      expect(weighIn(rs).massKg).toBeCloseTo(sum, 9)
      expect(weighIn(rs, 'lb-in').massKg).toBeCloseTo(sum * 0.45359237, 9)
      const { arm } = massAndArm(rs)
      if (sum > 1e-9 && arm !== null) {
        const arms = rs.filter(r => r.weight > 0).map(r => r.arm)
        expect(arm).toBeGreaterThanOrEqual(Math.min(...arms) - 1e-9)
        expect(arm).toBeLessThanOrEqual(Math.max(...arms) + 1e-9)
      }
    }))
  })
})

describe('take-off mass and the units', () => {
  const readings = fc.array(reading, { minLength: 1, maxLength: 3 })
  const mass = fc.option(fc.double({ min: 30, max: 200, noNaN: true }), { nil: null })

  it('adding an occupant never lowers the take-off mass', () => {
    fc.assert(fc.property(readings, mass, fc.double({ min: 30, max: 200, noNaN: true }), fc.double({ min: 0, max: 200, noNaN: true }), (rs, pilot, copilot, ballast) => {
      const without = takeOffMass({ readings: rs, declaredBallastKg: ballast }, { pilotMassKg: pilot })
      const withCopilot = takeOffMass({ readings: rs, declaredBallastKg: ballast }, { pilotMassKg: pilot, copilotMassKg: copilot })
      expect(withCopilot.massKg).toBeGreaterThanOrEqual(without.massKg)
      expect(withCopilot.massKg - without.massKg).toBeCloseTo(copilot, 6)
    }))
  })

  it('a dossier with no units yields the unit findings: no collision-warning unit, no flight recorder', () => {
    fc.assert(fc.property(anyDossier, (d) => {
      const bare = { ...d, units: [] }
      const ids = evaluate(bare, competition(), buildField([bare])).map(f => f.checkId)
      expect(ids).toContain('collision-warning.present')
      expect(ids).toContain('recorder.present')
    }))
  })
})
