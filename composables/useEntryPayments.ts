import type { CompetitionPaymentsResponse, EntryPaymentsResponse } from '#shared/types/api-payments'
import type { PaymentMethod, PaymentRowStatus } from '#shared/constants/payments'

/** GET /api/competitions/:id/entries/:entryId/payments — fee due, what is owed, every payment and refund. */
export function useEntryPayments(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryPaymentsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/payments`,
    { key: () => `entry-payments:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}

/** GET /api/competitions/:id/payments — the organiser's payments table, by status and method. */
export function useCompetitionPayments(competitionId: MaybeRefOrGetter<string>, status: MaybeRefOrGetter<PaymentRowStatus | ''>, method: MaybeRefOrGetter<PaymentMethod | ''> = '') {
  return useFetch<CompetitionPaymentsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/payments`,
    {
      key: () => `competition-payments:${toValue(competitionId)}:${toValue(status)}:${toValue(method)}`,
      query: computed(() => ({ ...(toValue(status) ? { status: toValue(status) } : {}), ...(toValue(method) ? { method: toValue(method) } : {}) })),
    },
  )
}
