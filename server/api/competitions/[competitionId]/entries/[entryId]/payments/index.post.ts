// POST /api/competitions/:competitionId/entries/:entryId/payments — organisers (and site administrators).
// Records a payment by bank transfer, cash or another way, or a waiver of the fee; answers 201 { payment, created }.
import { entryParamsSchema } from '#shared/schemas/params'
import { paymentRecordBodySchema } from '#shared/schemas/payment'
import type { RecordPaymentResponse } from '#shared/types/api-payments'
import { recordPayment } from '#domain/payments/payments'

export default defineApiHandler(async (event): Promise<RecordPaymentResponse> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  const body = await validBody(event, paymentRecordBodySchema)
  const result = await recordPayment(access, body)
  setResponseStatus(event, result.created ? 201 : 200)
  return result
})
