// API messages of files sealed at rest (server/domain/files/file-crypt.ts); merged into MESSAGES by messages.ts.
export const STORED_FILES_MESSAGES = {
  storedFileDamaged: 'The stored file fails its integrity check, so it is not sent. The site administrator has the details in the server log; the entrant may need to upload it again.',
  storedFileKeyUnknown: 'The stored file is encrypted under a key this server does not have just now. The site administrator needs to add that key to NUXT_FILES_OLD_KEYS; nothing was changed.',
  filesKeyMissing: 'Files cannot be stored or opened just now: the server has no encryption key (NUXT_FILES_KEY). Nothing was changed; please tell the site administrator.',
} as const
