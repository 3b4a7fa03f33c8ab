// Vocabulary of card payments, shared by client and server.

/** One payment attempt: pending until the payment service confirms or gives up on it. */
export const PAYMENT_ROW_STATUSES = ['pending', 'paid', 'failed', 'refunded'] as const
export type PaymentRowStatus = (typeof PAYMENT_ROW_STATUSES)[number]

export const PAYMENT_ROW_STATUS_LABELS: Record<PaymentRowStatus, string> = {
  pending: 'Waiting for payment',
  paid: 'Paid',
  failed: 'Not completed',
  refunded: 'Refunded',
}

/** Mail templates this area queues. */
export const PAYMENT_MAIL_TEMPLATES = { received: 'payment-received', refund: 'payment-refund' } as const
