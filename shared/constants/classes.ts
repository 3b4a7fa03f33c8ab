// The FAI gliding classes and their default limits, offered when an organiser sets up a
// competition. Every limit is editable per competition.
// Source: FAI Sporting Code Section 3 (Gliding), Annex A class definitions — values here are
// `from memory` until checked against the current edition; the competition's local
// procedures prevail.

export interface FaiClassDefault {
  code: string
  name: string
  /** Maximum wing span in metres; null where the class sets none. */
  maxSpanM: number | null
  /** Maximum take-off mass in kg; null where the class sets none. */
  maxMtomKg: number | null
  waterBallast: boolean
  /** Other spellings pilots and flight recorders use for the class. */
  aliases: string[]
}

export const FAI_CLASSES: readonly FaiClassDefault[] = [
  { code: 'open', name: 'Open', maxSpanM: null, maxMtomKg: 850, waterBallast: true, aliases: ['Open Class'] }, // from memory
  { code: '20m-two-seater', name: '20 Metre Two-Seater', maxSpanM: 20, maxMtomKg: 800, waterBallast: true, aliases: ['20m', '20 Metre', 'Two-Seater', 'Double Seater', '20m Multi-seat'] }, // from memory
  { code: '18m', name: '18 Metre', maxSpanM: 18, maxMtomKg: 600, waterBallast: true, aliases: ['18m', '18 Meter', '18-Metre'] }, // from memory
  { code: '15m', name: '15 Metre', maxSpanM: 15, maxMtomKg: 525, waterBallast: true, aliases: ['15m', '15 Meter', 'Racing'] }, // from memory
  { code: 'standard', name: 'Standard', maxSpanM: 15, maxMtomKg: 525, waterBallast: true, aliases: ['Std', 'Standard Class'] }, // from memory
  { code: 'club', name: 'Club', maxSpanM: null, maxMtomKg: null, waterBallast: false, aliases: ['Club Class'] }, // from memory: limits by handicap list
  { code: '13.5m', name: '13.5 Metre', maxSpanM: 13.5, maxMtomKg: null, waterBallast: true, aliases: ['13.5m', '13.5 Meter'] }, // from memory
]

export function faiClass(code: string): FaiClassDefault | undefined {
  return FAI_CLASSES.find(c => c.code === code)
}
