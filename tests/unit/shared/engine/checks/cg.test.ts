import { describe, expect, it } from 'vitest'
import { cgWithinLimits } from '#shared/engine/checks/cg'
import type { WeighInRecord } from '#shared/engine/types'
import { ctx, dossier } from '../builders'

// Main wheel 0.10 m and tail wheel 4.10 m aft of the datum: CG = 0.10 + 4.00·G2/(G1+G2).
const weighed = (g1: number, g2: number): WeighInRecord => ({
  weighedOn: '2027-07-12', units: 'kg-m', readings: [{ point: 'main-wheel', weight: g1, arm: 0.1 }, { point: 'tail-wheel', weight: g2, arm: 4.1 }],
})
const limits = { cgForwardLimitM: 0.25, cgAftLimitM: 0.4 }

describe('cg.within-limits (flight manual; mass × arm method, FAA AC 43.13-1B ch. 10)', () => {
  it('passes a CG inside the limits (400 kg + 20 kg → 0.290 m)', () => {
    expect(cgWithinLimits.run(ctx(dossier({ weighIns: [weighed(400, 20)] }, limits)))).toEqual([])
  })

  it('blocks a CG ahead of the forward limit (400 kg + 10 kg → 0.198 m)', () => {
    const [f] = cgWithinLimits.run(ctx(dossier({ weighIns: [weighed(400, 10)] }, limits)))
    expect(f).toMatchObject({ severity: 'blocking' })
    expect(f!.reason).toContain('0.198 m aft of the datum')
    expect(f!.reason).toContain('ahead of the forward limit')
  })

  it('blocks a CG behind the aft limit (400 kg + 40 kg → 0.464 m)', () => {
    expect(cgWithinLimits.run(ctx(dossier({ weighIns: [weighed(400, 40)] }, limits)))[0]!.reason).toContain('behind the aft limit')
  })

  it('says nothing when the entry gives no CG limits', () => {
    expect(cgWithinLimits.run(ctx(dossier({ weighIns: [weighed(400, 40)] })))).toEqual([])
  })
})
