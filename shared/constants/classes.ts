// The FAI gliding classes and their default limits, offered when an organiser sets up a
// competition. Every limit is editable per competition; the competition's local procedures
// prevail. Where each value comes from (tests/unit/shared/constants/classes.test.ts holds them
// to these notes):
// - Spans: FAI Sporting Code Section 3, ch. 7.7 class definitions (web edition read, c. 2007):
//   "18 Metre Class: The only limitation is a maximum span of 18,000 mm", 15 Metre and Standard
//   15,000 mm, Open "No special rules"; Standard: water ballast "is permitted". 13.5 m: 13,500 mm
//   (a secondary source; Annex A not read).
// - Masses: Annex A (Rules for World Gliding Championships) sets them; its text could not be
//   read here (only the cover of the 2018 edition), so every mass is `from memory`, agreeing
//   with a secondary source (the encyclopedia's "Glider competition classes": Open 850 kg,
//   Standard and 15 m 525 kg, 18 m 600 kg, 20 m two-seater 750 kg). Check the current edition.
// - Club class: no water ballast in flight (secondary source); entry by a handicap range, no
//   span or mass limit of its own.

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
  { code: 'open', name: 'Open', maxSpanM: null, maxMtomKg: 850, waterBallast: true, aliases: ['Open Class'] }, // span: SC3 7.7 (no limit); mass from memory
  { code: '20m-two-seater', name: '20 Metre Two-Seater', maxSpanM: 20, maxMtomKg: 750, waterBallast: true, aliases: ['20m', '20 Metre', 'Two-Seater', 'Double Seater', '20m Multi-seat'] }, // mass from memory (750 kg, the secondary source's value)
  { code: '18m', name: '18 Metre', maxSpanM: 18, maxMtomKg: 600, waterBallast: true, aliases: ['18m', '18 Meter', '18-Metre'] }, // span: SC3 7.7; mass from memory
  { code: '15m', name: '15 Metre', maxSpanM: 15, maxMtomKg: 525, waterBallast: true, aliases: ['15m', '15 Meter', 'Racing'] }, // span: SC3 7.7; mass from memory
  { code: 'standard', name: 'Standard', maxSpanM: 15, maxMtomKg: 525, waterBallast: true, aliases: ['Std', 'Standard Class'] }, // span and ballast: SC3 7.7; mass from memory
  { code: 'club', name: 'Club', maxSpanM: null, maxMtomKg: null, waterBallast: false, aliases: ['Club Class'] }, // no limits of its own (handicap range); no water ballast
  { code: '13.5m', name: '13.5 Metre', maxSpanM: 13.5, maxMtomKg: 350, waterBallast: true, aliases: ['13.5m', '13.5 Meter'] }, // mass from memory: 350 kg; the class may limit wing loading instead
]

export function faiClass(code: string): FaiClassDefault | undefined {
  return FAI_CLASSES.find(c => c.code === code)
}
