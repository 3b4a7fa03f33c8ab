import type { DocumentListResponse } from '#shared/types/files'
import type { DocumentFileAccess } from '#shared/types/document-views'

/** GET …/entries/:entryId/documents — current documents of an entry, with history. */
export function useEntryDocuments(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<DocumentListResponse & DocumentFileAccess>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/documents`,
    { key: () => `entry-documents:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
