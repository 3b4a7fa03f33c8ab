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

/** One term of the take-off mass: what it is, its mass in kg and its arm in m (null where unknown). */
export interface MassTerm {
  term: 'glider' | 'ballast' | 'pilot' | 'copilot'
  label: string
  massKg: number
  armM: number | null
}

export interface TakeOffMass {
  terms: MassTerm[]
  massKg: number
  /** The CG with every term; null when a term with mass has no lever arm (the flight manual's value not entered). */
  cgArmM: number | null
  /** The terms whose arm is missing, so the CG cannot be computed. */
  armsMissing: MassTerm['term'][]
  /** Whether the pilot's weighed mass is recorded (without it the take-off mass counts the glider only). */
  pilotKnown: boolean
}

/** What the take-off mass reads of the entry: the occupants' masses and the flight manual's arms. */
export interface TakeOffMassEntry {
  copilotName?: string | null
  pilotMassKg?: number | null
  copilotMassKg?: number | null
  pilotArmM?: number | null
  copilotArmM?: number | null
  ballastArmM?: number | null
}

/**
 * Take-off mass at a weigh-in = the scale readings (the glider as it stands on the scales) + the
 * declared water ballast when weighed dry + the pilot's and co-pilot's weighed masses with
 * parachute. The CG adds each term's moment: Σ(W·arm)/ΣW over every item aboard, the method of
 * the FAA's weight-and-balance handbook (FAA-H-8083-1, computing the loaded CG from the empty
 * weight and the useful load at their arms).
 */
export function takeOffMass(weigh: { readings: readonly ScaleReading[], units?: WeighUnits, declaredBallastKg?: number | null }, entry: TakeOffMassEntry): TakeOffMass {
  const glider = weighIn(weigh.readings, weigh.units ?? 'kg-m')
  const terms: MassTerm[] = [{ term: 'glider', label: 'Scale readings', massKg: glider.massKg, armM: glider.cgArmM }]
  const ballast = weigh.declaredBallastKg ?? 0
  if (ballast > 0) terms.push({ term: 'ballast', label: 'Declared water ballast (weighed dry)', massKg: ballast, armM: entry.ballastArmM ?? null })
  const pilotKnown = entry.pilotMassKg != null && entry.pilotMassKg > 0
  if (pilotKnown) terms.push({ term: 'pilot', label: 'Pilot with parachute', massKg: entry.pilotMassKg!, armM: entry.pilotArmM ?? null })
  if (entry.copilotMassKg != null && entry.copilotMassKg > 0) terms.push({ term: 'copilot', label: 'Co-pilot with parachute', massKg: entry.copilotMassKg, armM: entry.copilotArmM ?? null })
  let massKg = 0
  let moment = 0
  const armsMissing: MassTerm['term'][] = []
  for (const t of terms) {
    massKg += t.massKg
    if (t.armM == null) {
      if (t.massKg > 0) armsMissing.push(t.term)
    }
    else moment += t.massKg * t.armM
  }
  return { terms, massKg, cgArmM: armsMissing.length || massKg <= 0 ? null : moment / massKg, armsMissing, pilotKnown }
}
