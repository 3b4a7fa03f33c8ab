// The outbox's own words, shared by the mail worker and the tests that read the outbox.

/** What an e-mail's body says once emptied after sending: it carried a one-time link. */
export const FORGOTTEN_BODY = 'This message held a one-time link. Its text was removed once it was sent.'
