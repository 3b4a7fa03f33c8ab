import { z } from 'zod'
import { normaliseShortCode, SHORT_CODE_PROBLEMS, shortCodeProblem, TAG_TOKEN_PATTERN } from '../utils/short-code'
import { uuid } from './params'

export { normaliseShortCode, TAG_TOKEN_PATTERN }
export const tagTokenSchema = z.string().regex(TAG_TOKEN_PATTERN, { error: 'That is not a Gridmark tag.' })
export const tagTokenParamsSchema = z.object({ token: tagTokenSchema })

export const shortCodeSchema = z
  .string({ error: SHORT_CODE_PROBLEMS.missing })
  .transform(normaliseShortCode)
  .superRefine((s, ctx) => {
    const problem = shortCodeProblem(s)
    if (problem) ctx.addIssue({ code: 'custom', message: problem })
  })
export const shortCodeParamsSchema = z.object({ competitionId: uuid, code: shortCodeSchema })

/** Which tags to issue or print: one class, or chosen entries (neither = every accepted entry). */
export const tagSelectionSchema = z.object({
  classId: uuid.optional(),
  entryIds: z.array(uuid).min(1, { error: 'Choose at least one entry.' }).max(1000, { error: 'Choose at most 1,000 entries at a time.' }).optional(),
}, { error: 'Send the selection as an object.' }).strict().refine(s => !(s.classId && s.entryIds), { error: 'Choose a class or entries, not both.' })
export type TagSelection = z.infer<typeof tagSelectionSchema>

/** The same selection in a query string (entryIds comma-separated), for the sheet's PDF. */
export const tagSheetQuerySchema = z.object({
  classId: uuid.optional(),
  entryIds: z.string().optional().transform(s => (s ? s.split(',').filter(Boolean) : undefined)).pipe(z.array(uuid).max(1000).optional()),
})
