// GET /api/competitions/:competitionId/entries/:entryId/payments — the entrant or the staff.
// The fee due (with any late fee), what is still to pay, the payment state and history.
import { entryPaymentParamsSchema } from '#shared/schemas/payment'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryPaymentParamsSchema)
  const { entry, competition, isOwner } = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return entryPayments(entry, competition, isOwner)
})
