// API messages of the entries area; merged into MESSAGES by messages.ts.
export const ENTRIES_MESSAGES = {
} as const
