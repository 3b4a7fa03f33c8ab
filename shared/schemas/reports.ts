// The office's paperwork: the tracking list's query and the glider reports' params.
import { z } from 'zod'
import { isoDate } from './competition'
import { uuid } from './params'

/**
 * GET …/tracking.csv|json?board=today|YYYY-MM-DD — every accepted entry, or only those on that
 * day's board (`today` is the competition's own calendar date).
 */
export const trackingQuerySchema = z.object({
  board: z.union([z.literal('today'), isoDate], { error: 'Filter by board with board=today or a date as YYYY-MM-DD.' }).optional(),
})
export type TrackingQuery = z.infer<typeof trackingQuerySchema>

/** GET …/classes/:classId/report.pdf */
export const classReportParamsSchema = z.object({ competitionId: uuid, classId: uuid })
