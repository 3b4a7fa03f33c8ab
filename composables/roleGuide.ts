import type { Role } from '#shared/constants/roles'

// What each role does in a competition and where it goes next, in the product's own words.
// Links point at the competition overview until the role pages arrive.
export interface RoleGuide {
  /** One line for the home page card. */
  next: string
  /** The call to action on the home page. */
  action: string
  /** What the role does here, for the competition overview. */
  duties: string[]
}

export const ROLE_ORDER: readonly Role[] = ['organiser', 'director', 'scrutineer', 'entrant']

export const ROLE_GUIDE: Record<Role, RoleGuide> = {
  organiser: {
    next: 'Set up classes, rules and fees; invite officials; accept entries.',
    action: 'Open the competition office',
    duties: [
      'Set up the competition, its classes, rules and fees.',
      'Invite scrutineers and the contest director.',
      'Accept entries, refund withdrawals and print glider tags.',
      'Export the entry list and the scrutineering log.',
    ],
  },
  director: {
    next: 'Watch the readiness board; hold, release or waive.',
    action: 'Open the readiness board',
    duties: [
      'Open each contest day and watch the readiness board.',
      'Hold or release a glider.',
      'Accept a finding for one day with a recorded reason (a waiver).',
    ],
  },
  scrutineer: {
    next: 'Review documents, then check gliders on the launch grid.',
    action: 'Go to scrutineering',
    duties: [
      'Review entrants’ documents before the event.',
      'On each contest day, scan a glider’s tag on the launch grid and work through the day’s checklist.',
      'Weigh when asked and record the outcome of each grid check.',
    ],
  },
  entrant: {
    next: 'Describe your glider and its units, upload documents, see your findings.',
    action: 'See your entry',
    duties: [
      'Describe your glider and the units fitted to it.',
      'Upload documents and an IGC file from each flight recorder.',
      'Pay the entry fee.',
      'See your findings early and fix them before you arrive.',
    ],
  },
}

export function sortRoles(roles: readonly Role[]): Role[] {
  return ROLE_ORDER.filter(r => roles.includes(r))
}
