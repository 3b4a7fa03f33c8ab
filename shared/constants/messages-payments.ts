// API messages of the payments area; merged into MESSAGES by messages.ts.
export const PAYMENTS_MESSAGES = {
} as const
