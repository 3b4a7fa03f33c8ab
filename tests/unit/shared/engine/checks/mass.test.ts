import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION } from '#shared/engine/caution'
import { massClassLimit, massFlightManual } from '#shared/engine/checks/mass'
import type { WeighInRecord } from '#shared/engine/types'
import { competition, ctx, dossier } from '../builders'

// The scale readings are of the glider alone; the pilot's weighed mass with parachute (85 kg
// here) is added (DESIGN.md: take-off mass = scale readings + declared ballast + occupants).
const PILOT = { pilotMassKg: 85 }

const weighed = (main: number, tail: number, weighedOn = '2027-07-12'): WeighInRecord => ({
  id: 'w1', weighedOn, units: 'kg-m', readings: [{ point: 'main-wheel', weight: main, arm: 0.2 }, { point: 'tail-wheel', weight: tail, arm: 4.5 }],
})

describe('mass.class-limit (FAI Sporting Code Section 3 Annex A class limits — from memory (Annex A, check the current edition))', () => {
  it('passes a Standard class glider weighed at exactly 525 kg', () => {
    expect(massClassLimit.run(ctx(dossier({ weighIns: [weighed(415, 25)] }, PILOT)))).toEqual([])
  })

  it('blocks 525.5 kg in the Standard class (525 kg), with both masses and the caution', () => {
    const [f] = massClassLimit.run(ctx(dossier({ weighIns: [weighed(415.5, 25)] }, PILOT)))
    expect(f).toMatchObject({ severity: 'blocking', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('525.5 kg (440.5 kg on the scales + pilot with parachute 85.0 kg)')
    expect(f!.reason).toContain('at most 525.0 kg')
  })

  it('falls back to the FAI default when the competition sets no limit for the class (18 Metre: 600 kg)', () => {
    const comp = competition({}, { classLimits: {} })
    expect(massClassLimit.run(ctx(dossier({ weighIns: [weighed(495, 25)] }, { ...PILOT, classCode: '18m', className: '18 Metre', mtomKg: 600 }), comp))).toHaveLength(1)
  })

  it('has no limit for the Club class (no water ballast; limits by handicap list — from memory)', () => {
    expect(massClassLimit.run(ctx(dossier({ weighIns: [weighed(800, 25)] }, { ...PILOT, classCode: 'club', className: 'Club', mtomKg: null })))).toEqual([])
  })

  it('uses the weigh-in of the day evaluated, or the latest before it', () => {
    const d = dossier({ weighIns: [weighed(395, 25, '2027-07-12'), weighed(425, 25, '2027-07-14')] }, PILOT)
    expect(massClassLimit.run(ctx(d, undefined, undefined, '2027-07-13'))).toEqual([])
    expect(massClassLimit.run(ctx(d, undefined, undefined, '2027-07-14'))).toHaveLength(1)
  })

  it('says nothing without a weigh-in', () => {
    expect(massClassLimit.run(ctx(dossier()))).toEqual([])
  })
})

describe('mass.flight-manual (flight manual)', () => {
  it('blocks a mass above the glider’s own MTOM even inside the class limit', () => {
    const [f] = massFlightManual.run(ctx(dossier({ weighIns: [weighed(395, 25)] }, { ...PILOT, mtomKg: 500 })))
    expect(f!.reason).toContain('505.0 kg (420.0 kg on the scales + pilot with parachute 85.0 kg); the glider’s flight manual allows at most 500.0 kg')
  })

  it('passes at the MTOM and without an MTOM entered', () => {
    expect(massFlightManual.run(ctx(dossier({ weighIns: [weighed(390, 25)] }, { ...PILOT, mtomKg: 500 })))).toEqual([])
    expect(massFlightManual.run(ctx(dossier({ weighIns: [weighed(600, 25)] }, { ...PILOT, mtomKg: null })))).toEqual([])
  })

  it('converts pound readings before comparing (1 lb = 0.45359237 kg)', () => {
    const w: WeighInRecord = { weighedOn: '2027-07-12', units: 'lb-in', readings: [{ point: 'main-wheel', weight: 1000, arm: 8 }, { point: 'tail-wheel', weight: 110, arm: 177 }] }
    // 1110 lb = 503.49 kg
    expect(massFlightManual.run(ctx(dossier({ weighIns: [w] }, { pilotMassKg: 0.01, mtomKg: 503.01 })))).toHaveLength(1)
    expect(massFlightManual.run(ctx(dossier({ weighIns: [w] }, { pilotMassKg: 0.01, mtomKg: 504.01 })))).toEqual([])
  })
})
