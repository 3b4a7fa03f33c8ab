import type { BoardEntryDetail } from '#shared/types/api-board'

/**
 * GET /api/competitions/:id/board/entries/:entryId?day= — one entry on the board (staff): its
 * tile, findings with their waivers, the director's actions, and whether the caller may act.
 * Without a day the server takes the open day, else the latest.
 */
export function useBoardEntry(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>, day?: MaybeRefOrGetter<string | undefined>) {
  return useFetch<BoardEntryDetail>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/board/entries/${encodeURIComponent(toValue(entryId))}`,
    {
      key: () => `board-entry:${toValue(competitionId)}:${toValue(entryId)}:${toValue(day) ?? ''}`,
      query: computed(() => (toValue(day) ? { day: toValue(day) } : {})),
    },
  )
}
