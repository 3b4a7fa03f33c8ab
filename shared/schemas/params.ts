import { z } from 'zod'

export const uuid = z.uuid({ error: 'That is not a valid identifier.' })

export const competitionParamsSchema = z.object({ competitionId: uuid })
