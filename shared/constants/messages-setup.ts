// API messages of the setup area; merged into MESSAGES by messages.ts.
export const SETUP_MESSAGES = {
} as const
