// GET /api/competitions/:competitionId/board?day= — staff (organiser, scrutineer, director).
// The board of a day (the open day, else the latest) at one sequence number: BoardSnapshot.
// Server-Timing: auth, read (the snapshot's one statement and its text), zip (gzip, when sent so).
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { boardQuerySchema } from '#shared/schemas/board'
import type { BoardSnapshot } from '#shared/types/api-board'
import { boardSnapshotJson } from '#domain/board/snapshot'

export default defineApiHandler(event => withServerTiming(event, async (): Promise<BoardSnapshot> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { day } = await validQuery(event, boardQuerySchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  markTiming('auth')
  setResponseHeader(event, 'cache-control', 'no-store')
  // Wall screens poll this: the snapshot is sent as the JSON text boardSnapshotJson builds,
  // with nothing parsed or encoded again, gzipped when large. The client receives a
  // BoardSnapshot, hence the type.
  const text = await boardSnapshotJson(competition, day)
  markTiming('read')
  const sent = await sendJsonText(event, text)
  markTiming('zip')
  return sent as unknown as BoardSnapshot
}))
