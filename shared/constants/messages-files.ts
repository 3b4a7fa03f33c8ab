// API messages of the files area; merged into MESSAGES by messages.ts.
export const FILES_MESSAGES = {
} as const
