// API answers of the log of openings of medical and licence files.
import type { DocumentReader, DocumentViewerRole, PersonalDocumentKind } from '../utils/document-access'

/** One opening, as the pilot (and the office, on the entry) reads it. */
export interface EntryDocumentViewItem {
  id: string
  documentId: string | null
  documentKind: PersonalDocumentKind
  viewerName: string
  viewerRole: DocumentViewerRole
  /** The pilot opened their own file. */
  byEntrant: boolean
  /** ISO time */
  viewedAt: string
}

/** GET …/entries/:entryId/document-views: the newest openings first, at most `limit`. */
export interface EntryDocumentViewsResponse {
  views: EntryDocumentViewItem[]
  /** Every opening of the entry's files, also those beyond the list. */
  total: number
  limit: number
}

/** One opening, as the office reads the competition's log: with the entry and the address. */
export interface CompetitionDocumentViewItem extends Omit<EntryDocumentViewItem, 'byEntrant'> {
  entry: { id: string, compId: string, pilotName: string }
  clientAddress: string
}

/** GET /api/competitions/:competitionId/document-views?page=&pageSize=: newest first. */
export interface CompetitionDocumentViewsResponse {
  rows: CompetitionDocumentViewItem[]
  total: number
  page: number
  pageSize: number
}

/** Added to the document list and the review queue: the caller, for the need-to-know rule. */
export interface DocumentFileAccess {
  /** On the queue `isEntrant` is false: it spans every entry. */
  fileAccess: DocumentReader
}
