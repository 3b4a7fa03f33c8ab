// POST /api/competitions/:competitionId/entries/:entryId/checkout — the entry's own entrant.
// Opens a card payment for the fee due and answers the payment page's address { url, paymentId }.
import { entryParamsSchema } from '#shared/schemas/params'
import { emptyBodySchema } from '#shared/schemas/payment'
import { startCheckout } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await validBody(event, emptyBodySchema.optional())
  const { user, entry, competition } = await requireEntryAccess(event, competitionId, entryId, 'owner')
  setResponseStatus(event, 201)
  return startCheckout(event, entry, competition, user)
})
