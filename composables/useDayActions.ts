import type { DayOpenBody } from '#shared/schemas/board'
import type { BoardDay } from '#shared/types/api-board'

/** The director opens and closes contest days ($fetch); callers refresh useDays afterwards. */
export function useDayActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/days`
  return {
    open: (body: DayOpenBody) => $fetch<{ day: BoardDay, created: boolean }>(base(), { method: 'POST', body }),
    close: (day: string) => $fetch<{ day: BoardDay }>(`${base()}/${encodeURIComponent(day)}/close`, { method: 'POST' }),
  }
}
