// API messages of the document files' retention schedule; merged into MESSAGES by messages.ts.
export const RETENTION_MESSAGES = {
  documentFileDeleted: 'This file is no longer kept: it was deleted on the competition’s retention schedule. Its kind, validity dates and review outcome stay on record; the entry’s document list says when it went.',
} as const
