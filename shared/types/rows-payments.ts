// Row types of the payments area's tables, written by hand to match migrations/.
import type { PaymentMethod, PaymentRowStatus, RefundStatus } from '../constants/payments'

export interface PaymentRow {
  id: string
  competition_id: string
  entry_id: string
  created_by: string | null
  /** The checkout session (card payments only). */
  session_id: string | null
  payment_intent: string | null
  amount_minor: number
  currency: string
  status: PaymentRowStatus
  refunded_minor: number
  refund_id: string | null
  paid_at: Date | null
  refunded_at: Date | null
  created_at: Date
  updated_at: Date
  method: PaymentMethod
  reference: string | null
  reason: string | null
  recorded_by: string | null
  /** YYYY-MM-DD: the day a recorded payment was made. */
  paid_on: string | null
  idempotency_key: string | null
}

export interface PaymentRefundRow {
  id: string
  competition_id: string
  entry_id: string
  payment_id: string
  amount_minor: number
  reason: string | null
  recorded_by: string | null
  status: RefundStatus
  service_refund_id: string | null
  idempotency_key: string | null
  created_at: Date
  completed_at: Date | null
}

export interface PaymentEventRow {
  event_id: string
  type: string
  payment_id: string | null
  received_at: Date
}
