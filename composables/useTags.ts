import type { TagList } from '#shared/types/api-tags'

/** GET /api/competitions/:id/tags — accepted entries with their current tag (organiser). */
export function useTags(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<TagList>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/tags`, {
    key: () => `tags:${toValue(competitionId)}`,
  })
}
