// Response types of the payments area's routes.
import type { PaymentStatus } from '../constants/entries'
import type { PaymentMethod, PaymentRowStatus, RefundStatus } from '../constants/payments'

export interface RefundSummary {
  id: string
  amountMinor: number
  /** Null for a refund made at the payment service itself (or before reasons were kept). */
  reason: string | null
  status: RefundStatus
  /** Who made it; shown to staff only. */
  recordedByName: string | null
  createdAt: string
  completedAt: string | null
}

export interface PaymentSummary {
  id: string
  amountMinor: number
  currency: string
  status: PaymentRowStatus
  refundedMinor: number
  createdAt: string
  paidAt: string | null
  refundedAt: string | null
  method: PaymentMethod
  /** The bank's or receipt's reference of a recorded payment. */
  reference: string | null
  /** Why the fee was waived (or a note on a recorded payment). */
  reason: string | null
  /** YYYY-MM-DD: the day it was paid (a card payment's, in the competition's time zone). */
  paidOn: string | null
  /** Who recorded it (the office; null for a card payment); shown to staff only. */
  recordedByName: string | null
  /** What can still be refunded: the amount less refunds made or under way. */
  refundableMinor: number
  refunds: RefundSummary[]
}

export interface FeeDue {
  entryFeeMinor: number
  lateFeeMinor: number
  lateFeeApplies: boolean
  totalMinor: number
  currency: string
}

export interface EntryPaymentsResponse {
  entry: {
    id: string
    compId: string
    pilotName: string
    status: string
    paymentStatus: PaymentStatus
    /** Money received, net of refunds (waivers not included). */
    paidMinor: number
    waivedMinor: number
  }
  competitionName: string
  fee: FeeDue
  /** What is still to pay now (0 once paid). */
  amountDueMinor: number
  /** The caller may record a payment, a waiver or a refund (the organiser). */
  canRecord: boolean
  /** Today in the competition's time zone (YYYY-MM-DD): a recorded payment is dated no later. */
  today: string
  /** The caller may start a card payment (own entry, open, something due). */
  canPay: boolean
  /** Why not, when the caller is the entrant and cannot pay. */
  payBlockedReason: string | null
  payments: PaymentSummary[]
}

export interface CheckoutResponse {
  url: string
  paymentId: string
}

export interface CompetitionPaymentRow extends PaymentSummary {
  entryId: string
  compId: string
  pilotName: string
  entrantName: string
  entryStatus: string
  entryPaymentStatus: PaymentStatus
  /** Something of it remains to refund. */
  refundable: boolean
}

export interface CompetitionPaymentsResponse {
  currency: string
  rows: CompetitionPaymentRow[]
  /** Money collected and refunded (waivers apart: they are no money), and the payments listed. */
  totals: { collectedMinor: number, refundedMinor: number, netMinor: number, waivedMinor: number, count: number }
}

export interface RecordPaymentResponse {
  payment: PaymentSummary
  /** False when the same submission had already been recorded (a double click). */
  created: boolean
}
