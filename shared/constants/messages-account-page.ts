// API messages of the account page (name, password, export, deletion); merged into MESSAGES by
// messages.ts.
export const ACCOUNT_PAGE_MESSAGES = {
  currentPasswordWrong: 'That is not your current password. Type it again (it is the one you signed in with).',
  newPasswordSame: 'The new password is the same as the current one. Choose another.',
  accountPasswordWrong: 'That is not your password. Type the password you sign in with to delete the account.',
  onlyOrganiserOf: (competitions: string[]) =>
    `You are the only organiser of ${competitions.map(c => `“${c}”`).join(', ')}, which ${competitions.length === 1 ? 'is' : 'are'} not over yet. `
    + 'Invite another organiser (or ask a site administrator to make one) before you delete your account.',
  onlySiteAdmin: 'You are the only site administrator. Make another person a site administrator before you delete your account.',
}
