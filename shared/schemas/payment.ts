import { z } from 'zod'
import { PAYMENT_METHODS, PAYMENT_ROW_STATUSES, RECORDED_PAYMENT_METHODS } from '../constants/payments'
import { isoDate } from './competition'
import { entryParamsSchema, uuid } from './params'

/** The checkout and refund actions take no fields; an empty JSON object (or no body) is fine. */
export const emptyBodySchema = z.strictObject({}, {
  error: iss => (iss.code === 'unrecognized_keys' ? 'This action takes no fields.' : 'Send the fields as a JSON object.'),
})

export const paymentsQuerySchema = z.object({
  status: z.enum(PAYMENT_ROW_STATUSES, { error: `Status must be one of: ${PAYMENT_ROW_STATUSES.join(', ')}.` }).optional(),
  method: z.enum(PAYMENT_METHODS, { error: `Method must be one of: ${PAYMENT_METHODS.join(', ')}.` }).optional(),
})
export type PaymentsQuery = z.infer<typeof paymentsQuerySchema>

/** The part of a payment service event the app reads; the rest is ignored. */
export const paymentEventSchema = z.object({
  id: z.string().min(1).max(255),
  type: z.string().min(1).max(255),
  data: z.object({ object: z.record(z.string(), z.unknown()) }),
})

// ——— Payments any way: what the office records, waives and refunds —————————————————————

const amountMinor = z.number({ error: 'Enter the amount as a number.' })
  .int({ error: 'Enter the amount in whole cents.' })
  .positive({ error: 'The amount must be more than zero.' })
  .max(100_000_000, { error: 'The amount looks too large.' })

const optionalText = (label: string, max: number) => z.string({ error: `Enter the ${label} as text.` })
  .trim()
  .max(max, { error: `Keep the ${label} under ${max} characters.` })
  .optional()

/** Sent once per form submission: the same key twice records (or refunds) once. */
const idempotencyKey = z.string({ error: 'The submission key is not valid.' })
  .regex(/^[\w-]{8,100}$/, { error: 'The submission key is not valid.' })
  .optional()

/**
 * POST …/entries/:entryId/payments — the office records a payment made another way than by
 * card, or waives (part of) the fee. A bank transfer and "another way" need a reference (the
 * statement's, a cheque number…); cash may have a receipt number; a waiver needs its reason.
 */
export const paymentRecordBodySchema = z.object({
  method: z.enum(RECORDED_PAYMENT_METHODS, { error: `Choose how it was paid: ${RECORDED_PAYMENT_METHODS.join(', ')}.` }),
  amountMinor,
  date: isoDate,
  reference: optionalText('reference', 120),
  reason: optionalText('reason', 500),
  idempotencyKey,
}, { error: 'Send the payment as an object with a method, an amount and a date.' }).strict().superRefine((body, ctx) => {
  const has = (v: string | undefined) => Boolean(v && v.length)
  if (body.method === 'waived' && !(body.reason && body.reason.length >= 3)) {
    ctx.addIssue({ code: 'custom', path: ['reason'], message: 'Give the reason the fee is waived; the entrant is told it.' })
  }
  if (body.method === 'bank-transfer' && !has(body.reference)) {
    ctx.addIssue({ code: 'custom', path: ['reference'], message: 'Give the bank transfer’s reference, as it shows on the statement.' })
  }
  if (body.method === 'other' && !has(body.reference)) {
    ctx.addIssue({ code: 'custom', path: ['reference'], message: 'Say how it was paid, e.g. a cheque number or a voucher.' })
  }
})
export type PaymentRecordBody = z.infer<typeof paymentRecordBodySchema>

/** POST …/entries/:entryId/payments/:paymentId/refunds — part or all of what remains of one payment. */
export const refundBodySchema = z.object({
  amountMinor,
  reason: z.string({ error: 'Give the reason for the refund; the entrant is told it.' })
    .trim()
    .min(3, { error: 'Give the reason for the refund in a few words; the entrant is told it.' })
    .max(500, { error: 'Keep the reason under 500 characters.' }),
  idempotencyKey,
}, { error: 'Send the refund as an object with an amount and a reason.' }).strict()
export type RefundBody = z.infer<typeof refundBodySchema>

export const paymentParamsSchema = entryParamsSchema.extend({ paymentId: uuid })
