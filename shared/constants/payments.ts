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

// ——— Payments any way: recorded by the office, waived, refunded in parts ———————————————

/** How a payment was made. `waived` counts towards the fee but is no money. */
export const PAYMENT_METHODS = ['card', 'bank-transfer', 'cash', 'other', 'waived'] as const
export type PaymentMethod = (typeof PAYMENT_METHODS)[number]

/** What the office records by hand (a card payment comes from the payment service). */
export const RECORDED_PAYMENT_METHODS = ['bank-transfer', 'cash', 'other', 'waived'] as const
export type RecordedPaymentMethod = (typeof RECORDED_PAYMENT_METHODS)[number]

export const PAYMENT_METHOD_LABELS: Record<PaymentMethod, string> = {
  'card': 'Card',
  'bank-transfer': 'Bank transfer',
  'cash': 'Cash',
  'other': 'Another way',
  'waived': 'Fee waived',
}

/** A refund is pending while the payment service is asked (card refunds only). */
export const REFUND_STATUSES = ['pending', 'succeeded', 'failed'] as const
export type RefundStatus = (typeof REFUND_STATUSES)[number]

export const RECORDED_PAYMENT_MAIL_TEMPLATES = { recorded: 'payment-recorded', waived: 'payment-waived' } as const
