// Messages of the access decision (shared/utils/access.ts), which the page guard runs on every
// navigation; merged into MESSAGES by messages.ts. A file of their own, so the guard does not
// bring every message of the API into the page's first script.
export const ACCESS_MESSAGES = {
  notSignedIn: 'Please sign in to continue.',
  competitionNotFound: 'No such competition, or you are not part of it.',
  roleRequired: (roles: string) => `This needs the ${roles} role in this competition.`,
} as const
