// API messages of the mail area; merged into MESSAGES by messages.ts.
export const MAIL_MESSAGES = {
} as const
