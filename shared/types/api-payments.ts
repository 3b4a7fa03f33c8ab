// Response types of the payments area's routes.
import type { PaymentStatus } from '../constants/entries'
import type { PaymentRowStatus } from '../constants/payments'

export interface PaymentSummary {
  id: string
  amountMinor: number
  currency: string
  status: PaymentRowStatus
  refundedMinor: number
  createdAt: string
  paidAt: string | null
  refundedAt: string | null
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
    paidMinor: number
  }
  competitionName: string
  fee: FeeDue
  /** What is still to pay now (0 once paid). */
  amountDueMinor: number
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
  /** An organiser may refund it: a withdrawn entry with a paid payment. */
  refundable: boolean
}

export interface CompetitionPaymentsResponse {
  currency: string
  rows: CompetitionPaymentRow[]
  totals: { collectedMinor: number, refundedMinor: number, netMinor: number, count: number }
}
