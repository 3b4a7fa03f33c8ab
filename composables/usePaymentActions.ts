import type { CheckoutResponse, PaymentSummary, RecordPaymentResponse } from '#shared/types/api-payments'
import type { PaymentRecordBody, RefundBody } from '#shared/schemas/payment'

/**
 * Payments of the competition's entries ($fetch): the entrant's card checkout (the answer is
 * the payment service's page to go to); the organiser's recorded payment or waiver, and the
 * refund of part or all of one payment. Callers refresh useEntryPayments, useEntry or
 * useCompetitionPayments afterwards.
 */
export function usePaymentActions(competitionId: MaybeRefOrGetter<string>) {
  const entry = (entryId: string) => `/api/competitions/${toValue(competitionId)}/entries/${entryId}`
  return {
    checkout: (entryId: string) => $fetch<CheckoutResponse>(`${entry(entryId)}/checkout`, { method: 'POST', body: {} }),
    record: (entryId: string, body: PaymentRecordBody) => $fetch<RecordPaymentResponse>(`${entry(entryId)}/payments`, { method: 'POST', body }),
    refund: (entryId: string, paymentId: string, body: RefundBody) =>
      $fetch<{ payment: PaymentSummary }>(`${entry(entryId)}/payments/${paymentId}/refunds`, { method: 'POST', body }),
  }
}
