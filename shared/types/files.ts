// API answers of the files area: documents, the review queue and IGC files.
import type { DocumentKind } from '../constants/entries'
import type { DocumentStatus, FileDeletionReason } from '../constants/files'

export interface DocumentView {
  id: string
  entryId: string
  kind: DocumentKind
  originalFilename: string
  mediaType: string
  sizeBytes: number
  sha256: string
  /** YYYY-MM-DD */
  expiresOn: string
  status: DocumentStatus
  reviewReason: string | null
  reviewedAt: string | null
  reviewedByName: string | null
  uploadedAt: string
  uploadedByName: string
  superseded: boolean
  replacedBy: string | null
  /**
   * Set once the stored file was deleted on the retention schedule (the row stays): the day
   * (YYYY-MM-DD, competition time zone), why, and the sentence the lists show instead of a link.
   */
  fileDeleted: { on: string, reason: FileDeletionReason, keptDays: number, note: string } | null
}

export interface DocumentListResponse {
  /** The current document of each kind uploaded so far. */
  current: DocumentView[]
  /** Replaced uploads, newest first. */
  history: DocumentView[]
}

export interface QueueDocumentView extends DocumentView {
  compId: string
  pilotName: string
  gliderType: string
  registration: string
}

export interface DocumentQueueResponse {
  documents: QueueDocumentView[]
}

export interface IgcFileView {
  id: string
  entryId: string
  unitId: string | null
  originalFilename: string
  sizeBytes: number
  sha256: string
  /** YYYY-MM-DD from HFDTE */
  flightDate: string | null
  pilot: string | null
  copilot: string | null
  gliderType: string | null
  gliderId: string | null
  competitionId: string | null
  competitionClass: string | null
  recorderType: string | null
  firmwareVersion: string | null
  /** The A record's manufacturer code and serial id ("XXXABC"). */
  recorderId: string | null
  /** The I record's extension codes. */
  extensions: string[]
  hasGRecord: boolean
  parseErrors: { line: number, message: string }[]
  uploadedAt: string
  uploadedByName: string
  superseded: boolean
  replacedBy: string | null
}

export interface IgcFileListResponse {
  current: IgcFileView[]
  history: IgcFileView[]
}

/** POST /api/admin/retention/run: how many stored files the run deleted, by rule. */
export interface RetentionRunResult {
  medicalDeleted: number
  supersededDeleted: number
}
