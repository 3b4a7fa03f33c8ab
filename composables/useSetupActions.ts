import type { z } from 'zod'
import type { ClassCreateInput, classFormSchema, competitionSetupSchema } from '#shared/schemas/competition'
import type { CompetitionSetupResponse } from '#shared/types/setup'

/**
 * The organiser's set-up of one competition and its classes ($fetch). Errors are thrown for
 * the forms to show; callers refresh useCompetitionSetup (or take the saved set-up) afterwards.
 */
export function useSetupActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${toValue(competitionId)}`
  return {
    /** The whole set-up form in one save; the answer is the set-up as stored. */
    save: (body: z.output<typeof competitionSetupSchema>) => $fetch<CompetitionSetupResponse>(base(), { method: 'PATCH', body }),
    addClass: (body: ClassCreateInput) => $fetch(`${base()}/classes`, { method: 'POST', body }),
    updateClass: (classId: string, body: z.output<typeof classFormSchema>) => $fetch(`${base()}/classes/${classId}`, { method: 'PATCH', body }),
    deleteClass: (classId: string) => $fetch(`${base()}/classes/${classId}`, { method: 'DELETE' }),
  }
}
