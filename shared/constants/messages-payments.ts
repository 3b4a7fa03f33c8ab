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
  refundNeedsWithdrawal: 'Only a withdrawn entry can be refunded. Withdraw the entry first.',
  refundNothingPaid: 'This entry has no card payment to refund.',
  refundAlreadyDone: 'This entry’s payment has already been refunded.',
} as const
