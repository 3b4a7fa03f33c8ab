import type { z } from 'zod'
import type { competitionCreateSchema } from '#shared/schemas/competition'

/** The site administrator creates a competition ($fetch); callers refresh useCompetitions afterwards. */
export function useCompetitionActions() {
  return {
    create: (body: z.output<typeof competitionCreateSchema>) => $fetch<{ id: string }>('/api/competitions', { method: 'POST', body }),
  }
}
