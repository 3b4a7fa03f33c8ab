// API messages of the payments area; merged into MESSAGES by messages.ts.
export const PAYMENTS_MESSAGES = {
  paymentsNotConfigured: 'Card payment is not set up for this site yet. Please ask the organiser how to pay the entry fee.',
  paymentServiceDown: 'The payment service could not be reached just now. Nothing was charged; please try again in a moment.',
  entryAlreadyPaid: 'This entry’s fee is already paid.',
  entryClosedForPayment: 'A withdrawn or rejected entry cannot be paid.',
  nothingToPay: 'There is no entry fee to pay for this entry.',
  webhookSignatureMissing: 'This notification has no payment service signature, so it was not processed.',
  webhookSignatureInvalid: 'The signature on this notification does not match the payment service’s, so it was not processed.',
  webhookBodyInvalid: 'This notification is not a payment service event.',

  // ——— Payments any way: recorded payments, waivers, refunds of any part ———
  paymentNotFound: 'No such payment on this entry.',
  paymentDateInFuture: (today: string) => `A payment cannot be dated after today (${today}, in the competition’s time zone).`,
  nothingToWaive: 'Nothing of the fee is owed, so there is nothing to waive.',
  waiverTooLarge: (owed: string) => `Only ${owed} of the fee is owed; waive at most that.`,
  refundNotPaid: 'This payment was never completed, so there is nothing to refund.',
  refundAlreadyDone: 'This payment has already been refunded in full.',
  refundTooMuch: (remaining: string) => `At most ${remaining} of this payment can still be refunded.`,
  refundServiceDown: 'The payment service could not be reached just now. Nothing was refunded; please try again in a moment.',
} as const
