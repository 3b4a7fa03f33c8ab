// The rulebook's families: the engine's checks grouped by what they look at, read from the
// first part of a check's id (`firmware.valid-through-contest` → collision-warning units), and
// the checks and grid checklist items whose fix touches hardware. A new check whose prefix is
// not here fails tests/unit/shared/utils/rulebook.test.ts until it is given a family.

export const CHECK_FAMILIES = [
  { id: 'collision-warning', title: 'Collision-warning units', lead: 'The units that warn of other aircraft and obstacles: their firmware, obstacle data and radio ID.' },
  { id: 'identity', title: 'The glider in the competition', lead: 'How the glider is told apart from the others on the grid and in the air.' },
  { id: 'papers', title: 'Papers', lead: 'The documents the competition asks for, reviewed by a scrutineer.' },
  { id: 'recorders', title: 'Flight recorders and IGC files', lead: 'The recorders that prove each flight, and the files they write.' },
  { id: 'weighing', title: 'Weighing, span and ballast', lead: 'Mass, centre of gravity, span and water ballast against the class and the flight manual.' },
  { id: 'office', title: 'The office', lead: 'What the competition office needs settled before the first contest day.' },
] as const

export type CheckFamilyId = (typeof CHECK_FAMILIES)[number]['id']

/** The family of each check-id prefix (the part before the first dot). */
export const FAMILY_OF_PREFIX: Readonly<Record<string, CheckFamilyId>> = {
  'firmware': 'collision-warning',
  'obstacles': 'collision-warning',
  'radio-id': 'collision-warning',
  'collision-warning': 'collision-warning',
  'competition-id': 'identity',
  'documents': 'papers',
  'recorder': 'recorders',
  'declaration': 'recorders',
  'igc': 'recorders',
  'motor-glider': 'recorders',
  'mass': 'weighing',
  'cg': 'weighing',
  'span': 'weighing',
  'ballast': 'weighing',
  'entry': 'office',
}

export function checkFamily(checkId: string): CheckFamilyId | undefined {
  return FAMILY_OF_PREFIX[checkId.split('.')[0]!]
}

/**
 * The checks whose findings carry the hardware caution: putting them right means updating,
 * re-fitting or re-configuring something on the glider (DESIGN.md, Safety and deference).
 */
export const HARDWARE_CHECK_IDS: readonly string[] = [
  'firmware.valid-through-contest',
  'firmware.expires-soon',
  'firmware.yearly-update',
  'obstacles.current',
  'radio-id.format',
  'radio-id.unique',
  'radio-id.registration',
  'collision-warning.present',
  'recorder.present',
  'declaration.matches-entry',
  'declaration.recent',
  'igc.security-record',
  'mass.class-limit',
  'mass.flight-manual',
  'cg.within-limits',
  'ballast.class-rule',
  'recorder.igc-file',
  'recorder.identity',
  'motor-glider.engine-recording',
]

/** Grid checklist items whose failure is put right on the glider itself: the caution shows under a failed one. */
export const HARDWARE_CHECKLIST_ITEM_IDS: readonly string[] = ['antennas', 'ballast', 'water-ballast-empty']
