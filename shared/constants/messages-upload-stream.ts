// API messages of uploads streamed to storage; merged into MESSAGES by messages.ts.
export const UPLOAD_STREAM_MESSAGES = {
  uploadInterrupted: 'The upload was interrupted before the whole file arrived. Nothing was stored; please send it again.',
} as const
