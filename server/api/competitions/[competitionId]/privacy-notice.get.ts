// GET /api/competitions/:competitionId/privacy-notice — anyone, signed in or not (it is read
// before signing up). The competition's privacy notice, filled from its set-up, organisers and rules.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { CompetitionPrivacyNotice } from '#shared/types/api-privacy'
import { competitionPrivacyNotice } from '#domain/competitions/privacy-notice'

export default defineApiHandler(async (event): Promise<CompetitionPrivacyNotice> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  return competitionPrivacyNotice(competitionId)
})
