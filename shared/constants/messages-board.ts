// API messages of contest days, the live board and the director's desk; merged into MESSAGES.
export const BOARD_MESSAGES = {
  dayAlreadyOpen: (day: string) => `The day ${day} is open already. Close it before opening another.`,
  dayIsOpen: (day: string) => `The day ${day} is open.`,
  dayNotOpen: (day: string) => `The day ${day} is not open; open it on the contest days page first.`,
  noOpenDay: 'No contest day is open. The director opens the day first.',
  dayNotFound: 'That day has not been opened in this competition.',
  dayOutOfRange: 'A day can be opened from 14 days back to tomorrow, in the competition’s time zone.',
  dayKindNeeded: (day: string) => `${day} is not one of the competition’s practice or contest days; say whether it is a practice or a contest day.`,
  dayAlreadyClosed: (day: string) => `The day ${day} is closed already.`,
  reasonRequired: 'Give a reason; it is kept in the audit log and told to the entrant.',
  entryNotOnBoard: 'That entry is not on the board: only accepted entries are.',
  notHeld: 'That glider is not held by the director today, so there is nothing to release. A blocking finding needs a waiver instead.',
  alreadyHeld: 'The director holds that glider already today.',
  findingNotFound: 'That finding is not open on this entry (it may have been fixed or waived already). Reload the entry.',
  boardJoinRefused: 'You are not part of that competition’s board.',
  socketSignIn: 'Sign in to see the live board.',
} as const
