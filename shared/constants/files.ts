// Limits and vocabulary of uploaded documents and IGC files, shared by client and server.
export const DOCUMENT_MAX_BYTES = 10 * 1024 * 1024
export const IGC_MAX_BYTES = 5 * 1024 * 1024

/** Media types accepted for documents, detected from the file's content (magic bytes). */
export const DOCUMENT_MEDIA_TYPES = ['application/pdf', 'image/jpeg', 'image/png'] as const
export type DocumentMediaType = (typeof DOCUMENT_MEDIA_TYPES)[number]

export const DOCUMENT_STATUSES = ['pending', 'accepted', 'rejected'] as const
export type DocumentStatus = (typeof DOCUMENT_STATUSES)[number]

export const DOCUMENT_STATUS_LABELS: Record<DocumentStatus, string> = {
  pending: 'Awaiting review',
  accepted: 'Accepted',
  rejected: 'Rejected',
}

/**
 * Why a document's stored file was deleted while its row stays (server/domain/files/retention.ts):
 * a pilot's medical or licence file the competition's retention days after its last contest
 * day, or a replaced copy of any kind once a newer copy had been accepted long enough.
 */
export const FILE_DELETION_REASONS = ['retention-medical', 'retention-superseded'] as const
export type FileDeletionReason = (typeof FILE_DELETION_REASONS)[number]
