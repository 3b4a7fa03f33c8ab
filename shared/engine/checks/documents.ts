// The documents a competition requires, each uploaded, accepted and valid through the contest.
import { DOCUMENT_KIND_LABELS } from '../../constants/entries'
import type { Check, EngineDocument, Finding } from '../types'

/** The document that speaks for its kind: an accepted one valid longest, else the newest pending, else a rejected one. */
function bestOfKind(docs: readonly EngineDocument[]): EngineDocument | undefined {
  const rank = (d: EngineDocument) => (d.status === 'accepted' ? 2 : d.status === 'pending' ? 1 : 0)
  let best: EngineDocument | undefined
  for (const d of docs) {
    if (!best || rank(d) > rank(best) || (rank(d) === rank(best) && (d.expiresOn ?? '') > (best.expiresOn ?? ''))) best = d
  }
  return best
}

export const documentsRequired: Check = {
  id: 'documents.required',
  severity: 'blocking',
  source: 'FAI Sporting Code Section 3 (valid certificate of airworthiness); local procedures',
  rule: 'Each document kind the competition requires is uploaded, accepted by a scrutineer, and valid through the last contest day (its expiry date is the last day it is valid).',
  run({ dossier, competition }) {
    const last = competition.lastContestDay
    const out: Finding[] = []
    for (const kind of competition.rules.requiredDocumentKinds) {
      const label = DOCUMENT_KIND_LABELS[kind]
      const best = bestOfKind(dossier.documents.filter(d => d.kind === kind))
      const base = { checkId: this.id, severity: 'blocking' as const, subject: `document:${kind}` }
      if (!best) {
        out.push({ ...base, reason: `No ${label.toLowerCase()} document is uploaded; the competition requires one.`, fixHint: `Upload your ${label.toLowerCase()} document, valid through ${last}.` })
      }
      else if (best.expiresOn && best.expiresOn < last) {
        out.push({ ...base, reason: `The ${label.toLowerCase()} document is valid until ${best.expiresOn}, the last contest day is ${last}.`, fixHint: `Upload your ${label.toLowerCase()} document, valid through ${last}.` })
      }
      else if (best.status === 'rejected') {
        out.push({ ...base, reason: `The ${label.toLowerCase()} document was rejected by a scrutineer.`, fixHint: 'Read the scrutineer’s reason on the document and upload a corrected one.' })
      }
      else if (best.status === 'pending') {
        out.push({ ...base, awaiting: 'review', reason: `The ${label.toLowerCase()} document is waiting for a scrutineer’s review.`, fixHint: 'Nothing for the pilot to do: a scrutineer reviews it, and it counts once accepted.' })
      }
      else if (!best.expiresOn) {
        out.push({ ...base, reason: `The ${label.toLowerCase()} document has no expiry date, so it cannot be shown valid through ${last}.`, fixHint: 'Enter the date the document is valid until.' })
      }
    }
    return out
  },
}
