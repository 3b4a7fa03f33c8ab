import type { CompetitionDocumentViewsResponse } from '#shared/types/document-views'

/** GET /api/competitions/:id/document-views?page= — the competition's log of openings of medical and licence files (organisers), newest first. */
export function useDocumentViews(competitionId: MaybeRefOrGetter<string>, page: MaybeRefOrGetter<number>) {
  return useFetch<CompetitionDocumentViewsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/document-views`,
    {
      key: () => `document-views:${toValue(competitionId)}:${toValue(page)}`,
      query: computed(() => ({ page: toValue(page) })),
    },
  )
}
