import { z } from 'zod'
import { PAYMENT_ROW_STATUSES } from '../constants/payments'

/** The checkout and refund actions take no fields; an empty JSON object (or no body) is fine. */
export const emptyBodySchema = z.strictObject({}, {
  error: iss => (iss.code === 'unrecognized_keys' ? 'This action takes no fields.' : 'Send the fields as a JSON object.'),
})

export const paymentsQuerySchema = z.object({
  status: z.enum(PAYMENT_ROW_STATUSES, { error: `Status must be one of: ${PAYMENT_ROW_STATUSES.join(', ')}.` }).optional(),
})
export type PaymentsQuery = z.infer<typeof paymentsQuerySchema>

/** The part of a payment service event the app reads; the rest is ignored. */
export const paymentEventSchema = z.object({
  id: z.string().min(1).max(255),
  type: z.string().min(1).max(255),
  data: z.object({ object: z.record(z.string(), z.unknown()) }),
})
