import type { OpenCompetition } from '#shared/types/api-entries'

/** GET /api/competitions/open — competitions whose registration is open today, with their classes. */
export function useOpenCompetitions() {
  return useFetch<{ competitions: OpenCompetition[] }>('/api/competitions/open', { key: 'open-competitions' })
}
