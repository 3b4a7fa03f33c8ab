// API messages of glider tags; merged into MESSAGES by messages.ts.
export const TAGS_MESSAGES = {
  tagNotFound: 'This tag is not known, or it has been replaced by a newer one. Use the glider’s current tag, or type its short code.',
  tagRevoked: 'This tag was replaced by a newer one and no longer counts. Use the glider’s current tag.',
  shortCodeNotFound: 'No glider of this competition has that short code. Check the characters under the QR code.',
  tagEntryNotAccepted: 'Tags are for accepted entries only; accept the entry first.',
  tagNoneToRevoke: 'This entry has no current tag to revoke.',
  shortCodesExhausted: 'Could not find a free short code for a tag just now; try again.',
  tagAccessRequired: 'Only the competition’s scrutineers, director and organisers can open another glider’s tag.',
} as const
