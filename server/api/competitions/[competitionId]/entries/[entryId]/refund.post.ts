// POST /api/competitions/:competitionId/entries/:entryId/refund — organisers (and site administrators).
// Refunds the card payment of a withdrawn entry in full; answers the payment as refunded.
import { entryParamsSchema } from '#shared/schemas/params'
import { emptyBodySchema } from '#shared/schemas/payment'
import { refundEntry } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await validBody(event, emptyBodySchema.optional())
  const { user, entry } = await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  return { payment: await refundEntry(entry, user.id) }
})
