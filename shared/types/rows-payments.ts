// Row types of the payments area's tables, written by hand to match migrations/.
import type { PaymentRowStatus } from '../constants/payments'

export interface PaymentRow {
  id: string
  competition_id: string
  entry_id: string
  created_by: string | null
  session_id: string
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
}

export interface PaymentEventRow {
  event_id: string
  type: string
  payment_id: string | null
  received_at: Date
}
