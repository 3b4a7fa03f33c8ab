// Tags and grid checks: the short-code alphabet and the day's default checklist.

/**
 * Short codes are typed by hand on a windy grid: 8 characters from an alphabet without the
 * look-alikes 0/O/Q, 1/I/L, 2/Z, 5/S, 8/B and U/V (common practice for hand-typed codes):
 * 22 characters, so 22^8 ≈ 5.5·10^10 codes per competition.
 */
export const SHORT_CODE_ALPHABET = '34679ACDEFGHJKMNPRTWXY'
export const SHORT_CODE_LENGTH = 8

/** The checklist answer of one item. */
export const CHECK_RESULTS = ['pass', 'fail', 'not-checked'] as const
export type CheckResult = (typeof CHECK_RESULTS)[number]

export interface ChecklistItem {
  /** A stable slug, kept in the answers. */
  id: string
  label: string
  /** What to look at, for a new scrutineer. */
  hint?: string
}

/** The day's checklist unless the competition sets its own (common practice on the grid). */
export const DEFAULT_CHECKLIST: readonly ChecklistItem[] = [
  { id: 'cwu-operating', label: 'Collision-warning unit powered and showing normal operation', hint: 'Status display or lamp shows it is working, with no error.' },
  { id: 'cwu-firmware', label: 'Firmware version on the unit matches the dossier', hint: 'Compare the version the unit shows with the one in the dossier.' },
  { id: 'recorder-declaration', label: 'Recorder declaration shows the right pilot, glider and competition ID', hint: 'Read the declaration on each flight recorder.' },
  { id: 'antennas', label: 'Antennas fitted', hint: 'Connected before the unit is powered.' },
  { id: 'ballast', label: 'Ballast as declared', hint: 'Water and fixed ballast as the entrant declared.' },
  { id: 'tag-readable', label: 'Tag readable', hint: 'The QR sticker scans and the competition ID on it is legible.' },
]

/**
 * The checklist item whose fourth answer is "the unit shows another version": the scrutineer
 * types what the collision-warning unit displays and the check corrects the dossier. A
 * competition's own checklist without this item offers the same under the units.
 */
export const UNIT_VERSION_ITEM_ID = 'cwu-firmware'

/**
 * The item a class without water ballast adds to the day's checklist by itself (FAI Sporting
 * Code Section 3: the Club class flies without water ballast). Failing it raises the finding
 * `ballast.class-rule`.
 */
export const WATER_BALLAST_EMPTY_ITEM: ChecklistItem = {
  id: 'water-ballast-empty',
  label: 'Water ballast tanks empty',
  hint: 'This class flies without water ballast: tanks and bags drained, as the competition’s rules say.',
}

/** How a scrutineer reached an entry on the grid. */
export const FOUND_BY = ['scan', 'code', 'list'] as const
export type FoundBy = (typeof FOUND_BY)[number]

/** A grid check (and an opened day) is for today, tomorrow (a phone ahead of midnight), or up to 14 days back. */
export const GRID_DAYS_BACK = 14
export const GRID_DAYS_AHEAD = 1

/**
 * The time of a grid check (the phone's clock) is believed when it lies on the check's
 * contest day in the competition's zone, give or take GRID_CHECK_DAY_SLACK_MINUTES, and is no
 * later than the server's clock plus GRID_CHECK_CLOCK_SLACK_MINUTES. A check made offline and
 * sent hours later is fine; a phone whose clock is wrong by a day or a year is refused, since
 * the latest time of checking decides the board's tile.
 */
export const GRID_CHECK_DAY_SLACK_MINUTES = 120
export const GRID_CHECK_CLOCK_SLACK_MINUTES = 5
