// API messages of invitations bound to the invited address; merged into MESSAGES by messages.ts.
export const INVITATIONS_MESSAGES = {
  // The full address, not a masked one: whoever holds a valid link already sees it on the
  // invitation page, and a masked "a…@example.org" cannot tell a person with several addresses
  // which one to sign in with.
  invitationForOtherAddress: (invited: string) =>
    `This invitation is for ${invited}. Sign out, then sign in or create an account with that address to accept it.`,
} as const
