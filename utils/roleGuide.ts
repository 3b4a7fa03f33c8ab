import type { Role } from '#shared/constants/roles'
import { roleLinkTo, type RoleLink } from './roleLinks'

// What each role does in a competition and where it goes next, in the product's own words.
// A role with no page of its own to start from points at its duties on the competition overview.
export interface RoleGuide {
  /** One line for the home page card. */
  next: string
  /** The call to action on the home page. */
  action: string
  /** Where the call to action goes (a RoleLink path); '' = this role's duties on the overview. */
  actionPath: string
  /** What the role does here, for the competition overview. */
  duties: string[]
  /** The role's pages, linked at the top of the competition overview (CompetitionPages). */
  links: RoleLink[]
}

export const ROLE_GUIDE: Record<Role, RoleGuide> = {
  organiser: {
    next: 'Set up classes, rules and fees; invite officials; accept entries.',
    action: 'Open the competition office',
    actionPath: '/entries',
    duties: [
      'Set up the competition, its classes, rules and fees.',
      'Invite scrutineers and the contest director.',
      'Accept entries, refund withdrawals and print glider tags.',
      'Export the entry list and the scrutineering log.',
    ],
    links: [
      { label: 'Entries', path: '/entries' },
      { label: 'Readiness board', path: '/board' },
      { label: 'Audit log', path: '/audit' },
      { label: 'Set-up', path: '/setup' },
      { label: 'People', path: '/people' },
      { label: 'Payments', path: '/payments' },
      { label: 'Document review', path: '/documents' },
      { label: 'Medical file openings', path: '/document-views' },
      { label: 'Firmware catalogue', path: '/firmware' },
      { label: 'Glider tags', path: '/tags' },
      { label: 'Contest days', path: '/days' },
      { label: 'Rulebook', path: '/checks' },
    ],
  },
  director: {
    next: 'Watch the readiness board; hold, release or waive.',
    action: 'Open the readiness board',
    actionPath: '/board',
    duties: [
      'Open each contest day and watch the readiness board.',
      'Hold or release a glider.',
      'Accept a finding for one day with a recorded reason (a waiver).',
    ],
    links: [
      { label: 'Readiness board', path: '/board' },
      { label: 'Contest days', path: '/days' },
      { label: 'Audit log', path: '/audit' },
      { label: 'Entries', path: '/entries' },
      { label: 'Launch grid', path: '/grid' },
      { label: 'Rulebook', path: '/checks' },
    ],
  },
  scrutineer: {
    next: 'Review documents, then check gliders on the launch grid.',
    action: 'Go to scrutineering',
    actionPath: '/documents',
    duties: [
      'Review entrants’ documents before the event.',
      'On each contest day, scan a glider’s tag on the launch grid and work through the day’s checklist.',
      'Weigh when asked and record the outcome of each grid check.',
    ],
    links: [
      { label: 'Launch grid', path: '/grid' },
      { label: 'Readiness board', path: '/board' },
      { label: 'Document review', path: '/documents' },
      { label: 'Entries', path: '/entries' },
      { label: 'Firmware catalogue', path: '/firmware' },
      { label: 'Rulebook', path: '/checks' },
    ],
  },
  entrant: {
    next: 'Describe your glider and its units, upload documents, see your findings.',
    action: 'See your entries',
    actionPath: '~/entries',
    duties: [
      'Describe your glider and the units fitted to it.',
      'Upload documents and an IGC file from each flight recorder.',
      'Pay the entry fee.',
      'See your findings early and fix them before you arrive.',
    ],
    links: [
      { label: 'Your entries', path: '~/entries' },
      { label: 'Enter a glider', path: '/entries/new' },
      { label: 'Rulebook', path: '/checks' },
    ],
  },
}

/** Where a role's call to action goes in one competition. */
export function roleActionTo(competitionId: string, role: Role): string {
  const path = ROLE_GUIDE[role].actionPath
  return path ? roleLinkTo(competitionId, path) : `/competitions/${competitionId}#role-${role}`
}
