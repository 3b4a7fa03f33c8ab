// Mass and CG from scale readings: the mass × arm method. Total mass is the sum of the
// readings; the CG arm is Σ(W·arm) / ΣW from the datum (FAA AC 43.13-1B ch. 10; FAA-H-8083-1).
import type { ScaleReading, WeighUnits } from './types'

export const KG_PER_LB = 0.45359237
export const M_PER_INCH = 0.0254

export interface WeighResult {
  massKg: number
  /** CG arm from the datum in metres (aft positive); null when nothing was weighed. */
  cgArmM: number | null
  momentKgM: number
}

export function lbToKg(lb: number): number {
  return lb * KG_PER_LB
}
export function inchToM(inch: number): number {
  return inch * M_PER_INCH
}

/** Total mass and moment in the units of the readings, and the CG arm Σ(W·arm)/ΣW. */
export function massAndArm(readings: readonly ScaleReading[]): { mass: number, moment: number, arm: number | null } {
  let mass = 0
  let moment = 0
  for (const r of readings) {
    mass += r.weight
    moment += r.weight * r.arm
  }
  return { mass, moment, arm: mass > 0 ? moment / mass : null }
}

/** Mass in kg and CG in m, converting lb and inch readings first. */
export function weighIn(readings: readonly ScaleReading[], units: WeighUnits = 'kg-m'): WeighResult {
  const metric = units === 'lb-in'
    ? readings.map(r => ({ ...r, weight: lbToKg(r.weight), arm: inchToM(r.arm) }))
    : readings
  const { mass, moment, arm } = massAndArm(metric)
  return { massKg: mass, cgArmM: arm, momentKgM: moment }
}

/**
 * The two-point form for a glider on its main wheel and tail wheel (or skid): with the main
 * wheel a from the datum and the tail point b behind the main wheel, x = a + b·G2/(G1+G2),
 * G1 the main-wheel and G2 the tail reading. Equal to Σ(W·arm)/ΣW with arms a and a + b.
 */
export function twoPointCg(a: number, b: number, g1: number, g2: number): number | null {
  const total = g1 + g2
  return total > 0 ? a + (b * g2) / total : null
}
