// Row type of the log of openings of medical and licence files, written by hand to match
// migrations/20261210000200_document_views.ts.
import type { DocumentViewerRole, PersonalDocumentKind } from '../utils/document-access'

export interface DocumentViewRow {
  /** bigserial, read as text by pg */
  id: string
  /** Null once the document itself was deleted (the record of the opening stays). */
  document_id: string | null
  entry_id: string
  competition_id: string
  document_kind: PersonalDocumentKind
  viewer_user_id: string
  viewer_role: DocumentViewerRole
  client_address: string
  viewed_at: Date
}
