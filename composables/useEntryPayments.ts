import type { CompetitionPaymentsResponse, EntryPaymentsResponse } from '#shared/types/api-payments'
import type { PaymentRowStatus } from '#shared/constants/payments'

/** GET /api/competitions/:id/entries/:entryId/payments — fee due, payment state and history. */
export function useEntryPayments(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryPaymentsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/payments`,
    { key: () => `entry-payments:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}

/** GET /api/competitions/:id/payments — the organiser's payments table. */
export function useCompetitionPayments(competitionId: MaybeRefOrGetter<string>, status: MaybeRefOrGetter<PaymentRowStatus | ''>) {
  return useFetch<CompetitionPaymentsResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/payments`,
    {
      key: () => `competition-payments:${toValue(competitionId)}:${toValue(status)}`,
      query: computed(() => (toValue(status) ? { status: toValue(status) } : {})),
    },
  )
}
