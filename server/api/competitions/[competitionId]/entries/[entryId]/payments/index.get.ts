// GET /api/competitions/:competitionId/entries/:entryId/payments — the entrant or the staff.
// The fee due (with any late fee), what is still to pay, the payment state, every payment and refund.
import { entryParamsSchema } from '#shared/schemas/params'
import { entryPayments } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryPayments(access)
})
