import { describe, expect, it } from 'vitest'
import { inchToM, lbToKg, massAndArm, twoPointCg, weighIn } from '#shared/engine/weigh-in'
import type { ScaleReading } from '#shared/engine/types'

describe('mass × arm', () => {
  it('FAA AC 43.13-1B, figure 10-11: total 2,036 lb and moment 43,428 lb·in give CG 21.33 in', () => {
    // The figure's items (weight lb × arm in): empty 1169 × 10.6, oil 17 × −49, pilot 170 × 16,
    // passengers 340 × 48, fuel 240 × 22, baggage 100 × 75.5.
    const items: ScaleReading[] = [[1169, 10.6], [17, -49], [170, 16], [340, 48], [240, 22], [100, 75.5]]
      .map(([weight, arm]) => ({ point: 'main-wheel', weight: weight!, arm: arm! }))
    const { mass, moment, arm } = massAndArm(items)
    expect(mass).toBe(2036)
    // The figure rounds each moment to the pound-inch (1169 × 10.6 = 12,391.4 → 12,391).
    expect(Math.abs(moment - 43428)).toBeLessThan(0.5)
    expect(arm!).toBeCloseTo(21.33, 2)
  })

  it('FAA-H-8083-1, electronic-calculator example (nose-wheel airplane): 340 lb on the nose wheel 78 in ahead of the main wheels, 2,006 lb in all → CG 13.2 in ahead of the main wheels (values as reproduced from the handbook by a study site, not read in the handbook itself: check the current edition)', () => {
    const readings: ScaleReading[] = [
      { point: 'main-wheel', weight: 2006 - 340, arm: 0 },
      { point: 'nose-wheel', weight: 340, arm: -78 },
    ]
    expect(massAndArm(readings).arm!).toBeCloseTo(-13.2, 1)
    expect(twoPointCg(0, -78, 2006 - 340, 340)!).toBeCloseTo(-13.2, 1)
  })

  it('the two-point form x = a + b·G2/(G1+G2) equals Σ(W·arm)/ΣW', () => {
    const a = 0.12
    const b = 4.3
    const readings: ScaleReading[] = [{ point: 'main-wheel', weight: 312.4, arm: a }, { point: 'tail-skid', weight: 21.7, arm: a + b }]
    expect(twoPointCg(a, b, 312.4, 21.7)!).toBeCloseTo(weighIn(readings).cgArmM!, 12)
  })

  it('takes three reaction points (main, tail and nose wheel)', () => {
    const r = weighIn([{ point: 'nose-wheel', weight: 20, arm: -1 }, { point: 'main-wheel', weight: 300, arm: 0.2 }, { point: 'tail-wheel', weight: 30, arm: 4 }])
    expect(r.massKg).toBe(350)
    expect(r.cgArmM!).toBeCloseTo((-20 + 60 + 120) / 350, 12)
  })

  it('converts lb and inch: 1 lb = 0.45359237 kg, 1 in = 0.0254 m (exact by definition)', () => {
    expect(lbToKg(1)).toBe(0.45359237)
    expect(inchToM(1)).toBe(0.0254)
    const r = weighIn([{ point: 'main-wheel', weight: 2036, arm: 43428 / 2036 }], 'lb-in')
    expect(r.massKg).toBeCloseTo(923.51, 2)
    expect(r.cgArmM!).toBeCloseTo(21.33 * 0.0254, 4)
  })

  it('gives no CG for an empty scale', () => {
    expect(weighIn([])).toEqual({ massKg: 0, cgArmM: null, momentKgM: 0 })
  })
})
