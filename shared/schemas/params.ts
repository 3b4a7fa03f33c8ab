import { z } from 'zod'

export const uuid = z.uuid({ error: 'That is not a valid identifier.' })

export const competitionParamsSchema = z.object({ competitionId: uuid })
/** One entry of a competition: every route under /competitions/:id/entries/:entryId. */
export const entryParamsSchema = competitionParamsSchema.extend({ entryId: uuid })
