// API messages of the privacy notices; merged into MESSAGES by messages.ts.
export const PRIVACY_MESSAGES = {
  privacyNoticeNotAccepted: 'Read the competition’s privacy notice and tick the box to confirm it: an entry is only taken with the notice confirmed.',
  privacyNoticeNotFound: 'There is no such competition, so no privacy notice either.',
  privacyContactEmail: 'Enter the privacy contact as an e-mail address like privacy@example.org, or leave it empty.',
} as const
