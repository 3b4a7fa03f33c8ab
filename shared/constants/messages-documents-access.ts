// API messages of need-to-know access to pilots' medical and licence files and of the log of
// who opened them; merged into MESSAGES by messages.ts.
export const DOCUMENTS_ACCESS_MESSAGES = {
  personalDocumentNeedToKnow: 'Only the pilot, the competition’s scrutineers and its organisers open medical and licence files. You can see the document’s kind, validity and review outcome on the entry.',
  personalDocumentReviewNeedToKnow: 'A medical or licence document is reviewed by someone who may open it: a scrutineer or organiser of this competition. Ask one of them, or hold that role here.',
  documentViewsPilotOrOrganiser: 'Only the pilot and the competition’s organisers see who opened the entry’s medical and licence files.',
} as const
