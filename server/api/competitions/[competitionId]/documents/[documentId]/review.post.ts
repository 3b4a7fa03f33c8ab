// POST /api/competitions/:competitionId/documents/:documentId/review — scrutineers and organisers.
// { decision: 'accept' } or { decision: 'reject', reason }; a rejection e-mails the entrant. A medical
// or licence document only by one who may open it (need to know: an administrator needs the role here).
import { competitionDocumentParamsSchema, reviewBodySchema } from '#shared/schemas/files'
import { reviewDocument } from '#domain/files/documents'

export default defineApiHandler(async (event) => {
  const { competitionId, documentId } = await validParams(event, competitionDocumentParamsSchema)
  const access = await requireRole(event, competitionId, ['scrutineer', 'organiser'])
  const body = await validBody(event, reviewBodySchema)
  const document = await reviewDocument({
    competitionId,
    competitionName: access.competition.name,
    documentId,
    actorUserId: access.user.id,
    reader: await documentReaderOf(access),
    body,
  })
  return { document }
})
