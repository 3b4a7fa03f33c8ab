// API messages of the entries area; merged into MESSAGES by messages.ts.
export const ENTRIES_MESSAGES = {
  registrationNotOpen: 'Registration for this competition is not open.',
  registrationClosedForEntrant: (closedOn: string) =>
    `Registration closed on ${closedOn}: only the organiser can change this entry now.`,
  entryLockedForEntrant: (status: string) =>
    `This entry is ${status}: only the organiser can change it now.`,
  organiserOrEntrantOnly: 'Only the entry’s entrant or the organiser can change it.',
  entryMessageWho: 'Only the entry’s entrant and the organisers write here; scrutineers and the director read along.',
  officeOnlyAfterAcceptance: (fields: string) =>
    `The entry is accepted: only the office changes its ${fields} now. Ask them with a message from the entry page.`,
  contestOverForEntrant: (lastDay: string) =>
    `The last contest day (${lastDay}) is over: only the organiser can change this entry now.`,
  classNotInCompetition: 'Choose one of this competition’s classes.',
  compIdTaken: (compId: string, pilot: string, registration: string) =>
    `Competition ID ${compId} is already taken by ${pilot} (${registration}).`,
  radioIdTaken: (radioId: string, compId: string, pilot: string, registration: string) =>
    `Radio ID ${radioId} is already used by entry ${compId} — ${pilot} (${registration}).`,
  radioIdTakenSameEntry: (radioId: string) =>
    `Radio ID ${radioId} is already used by another unit of this entry.`,
  unitNotFound: 'No such unit on this entry.',
  unitKindFixed: 'A unit cannot change its kind: delete it and add the other kind instead.',
  cgLimitsOrder: 'The forward CG limit must lie ahead of the aft limit.',
  cannotSubmit: (missing: string[]) => `The entry cannot be submitted yet: ${missing.join(' ')}`,
  cannotSubmitStatus: (status: string) => `This entry is ${status}; only a draft or a rejected entry can be submitted.`,
  alreadyWithdrawn: 'This entry is already withdrawn.',
  cannotDecideStatus: (status: string) => `This entry is ${status}; only a submitted entry can be accepted or rejected.`,
} as const
