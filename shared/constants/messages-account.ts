// API messages of the account's one-time links: password reset, e-mail confirmation, a changed
// address, the first administrator's password; merged into MESSAGES by messages.ts.
export const ACCOUNT_MESSAGES = {
  signUpCheckMail: (email: string) =>
    `Check your e-mail: we sent a link to ${email}. Open it to confirm your address, then sign in with your password.`,
  resetCheckMail: 'If an account uses that address, we have sent it a link to choose a new password. The link works once, for one hour. Check your spam folder too.',
  resetDone: 'Your password is changed and every session of the account was signed out. Sign in with the new password.',
  tokenInvalid: 'This link is not valid. Copy the whole link from the e-mail, or ask for a new one.',
  tokenUsed: 'This link was used already; each link works once. Ask for a new one if you still need it.',
  tokenExpired: 'This link has expired. Ask for a new one: it is sent at once.',
  emailConfirmed: 'Your e-mail address is confirmed.',
  emailChangeCheckMail: (email: string) =>
    `We sent a link to ${email}. Your address changes once you open it; until then you keep using the current one.`,
  emailChangeSame: 'That is already your e-mail address.',
  wrongPassword: 'That is not your current password.',
  verificationRequired: 'Confirm your e-mail address first: open the link we sent you, or ask for a new one with “Send the link again”.',
  verificationSent: (email: string) => `We sent a new link to ${email}. It works for 24 hours.`,
  alreadyVerified: 'Your e-mail address is confirmed already.',
  tooManyVerificationMails: 'We sent you several links in the last hour already. Check your spam folder, or try again later.',
}
