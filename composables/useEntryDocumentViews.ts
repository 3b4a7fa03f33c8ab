import type { EntryDocumentViewsResponse } from '#shared/types/document-views'

/** GET …/entries/:entryId/document-views — who opened the entry's medical and licence files (its pilot, organisers). */
export function useEntryDocumentViews(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryDocumentViewsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/document-views`,
    { key: () => `entry-document-views:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
