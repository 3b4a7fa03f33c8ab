import type { CheckoutResponse } from '#shared/types/api-payments'

/**
 * Card payments of the competition's entries ($fetch): the entrant's checkout (the answer is
 * the payment service's page to go to) and the organiser's refund. Callers refresh
 * useEntryPayments or useCompetitionPayments afterwards.
 */
export function usePaymentActions(competitionId: MaybeRefOrGetter<string>) {
  const entry = (entryId: string) => `/api/competitions/${toValue(competitionId)}/entries/${entryId}`
  return {
    checkout: (entryId: string) => $fetch<CheckoutResponse>(`${entry(entryId)}/checkout`, { method: 'POST', body: {} }),
    refund: (entryId: string) => $fetch(`${entry(entryId)}/refund`, { method: 'POST', body: {} }),
  }
}
