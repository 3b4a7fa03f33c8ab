// API messages of the mail area; merged into MESSAGES by messages.ts.
export const MAIL_MESSAGES = {
  invitationInvalid: 'This invitation link is not valid. Check that you copied the whole link from the e-mail.',
  invitationExpired: 'This invitation has expired. Ask the organiser to send you a new one.',
  invitationUsed: 'This invitation has already been used. If that was you, sign in to find the competition on your home page.',
  invitationRevoked: 'This invitation was withdrawn by the organiser.',
  invitationNotFound: 'No such invitation in this competition.',
  invitationNotPending: 'Only an invitation that has not been accepted or withdrawn can be withdrawn.',
  alreadyHoldsRole: 'That person already holds this role in this competition.',
  membershipNotFound: 'No such membership in this competition.',
  lastOrganiser: 'This is the competition’s last organiser. Invite or appoint another organiser before removing this one.',
} as const
