import type { DocumentQueueResponse } from '#shared/types/files'
import type { DocumentFileAccess } from '#shared/types/document-views'

/** GET /api/competitions/:id/documents/queue — documents awaiting review, oldest first. */
export function useDocumentQueue(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<DocumentQueueResponse & DocumentFileAccess>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/documents/queue`,
    { key: () => `document-queue:${toValue(competitionId)}` },
  )
}

/** The address of a document's file, for an <iframe>, <img> or link. */
export function documentFileUrl(competitionId: string, entryId: string, documentId: string): string {
  return `/api/competitions/${encodeURIComponent(competitionId)}/entries/${encodeURIComponent(entryId)}/documents/${encodeURIComponent(documentId)}/file`
}

export function igcFileUrl(competitionId: string, entryId: string, igcFileId: string): string {
  return `/api/competitions/${encodeURIComponent(competitionId)}/entries/${encodeURIComponent(entryId)}/igc-files/${encodeURIComponent(igcFileId)}/file`
}

/** "1.2 MB", "340 kB" — sizes as people read them. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} kB`
  return `${bytes} B`
}
