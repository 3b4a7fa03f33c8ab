// Small readers shared by the checks.
import { faiClass } from '../../constants/classes'
import type { ClassLimit, CheckContext, CollisionWarningUnit, Dossier, FlightRecorderUnit, IsoDate, WeighInRecord } from '../types'

export function collisionWarningUnits(d: Dossier): CollisionWarningUnit[] {
  return d.units.filter((u): u is CollisionWarningUnit => u.kind === 'collision-warning')
}

export function flightRecorders(d: Dossier): FlightRecorderUnit[] {
  return d.units.filter((u): u is FlightRecorderUnit => u.kind === 'flight-recorder')
}

/** How a unit is named in a reason: its model and serial or radio ID. */
export function unitLabel(u: CollisionWarningUnit | FlightRecorderUnit): string {
  if (u.kind === 'flight-recorder') return `flight recorder ${u.model} (serial ${u.serial})`
  const tag = u.radioId ? `radio ID ${u.radioId}` : u.serial ? `serial ${u.serial}` : ''
  return `collision-warning unit ${u.model}${tag ? ` (${tag})` : ''}`
}

/** The weigh-in that counts: the latest on or before the evaluated day (the latest of all without a day). */
export function currentWeighIn(ctx: CheckContext): WeighInRecord | undefined {
  let best: WeighInRecord | undefined
  for (const w of ctx.dossier.weighIns) {
    if (ctx.day && w.weighedOn > ctx.day) continue
    if (!best || w.weighedOn >= best.weighedOn) best = w
  }
  return best
}

export function formatKg(kg: number): string {
  return `${(Math.round(kg * 10) / 10).toFixed(1)} kg`
}

export function formatM(m: number): string {
  return `${(Math.round(m * 1000) / 1000).toFixed(3)} m`
}

export function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`
}

export function lastDay(ctx: CheckContext): IsoDate {
  return ctx.competition.lastContestDay
}

/**
 * The entry's class limits: the competition's setting for the class, else the FAI default
 * (shared/constants/classes.ts); each field falls back on its own.
 */
export function classLimitOf(ctx: CheckContext): { maxSpanM: number | null, maxMtomKg: number | null, waterBallast: boolean } {
  const code = ctx.dossier.entry.classCode
  const set: ClassLimit | undefined = ctx.competition.classLimits[code]
  const fai = faiClass(code)
  return {
    maxSpanM: set && set.maxSpanM !== undefined ? set.maxSpanM : (fai?.maxSpanM ?? null),
    maxMtomKg: set ? set.maxMtomKg : (fai?.maxMtomKg ?? null),
    waterBallast: set?.waterBallast ?? fai?.waterBallast ?? true,
  }
}
