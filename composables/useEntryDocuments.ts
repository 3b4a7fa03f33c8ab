import type { DocumentListResponse } from '#shared/types/files'

/** GET …/entries/:entryId/documents — current documents of an entry, with history. */
export function useEntryDocuments(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<DocumentListResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/documents`,
    { key: () => `entry-documents:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
