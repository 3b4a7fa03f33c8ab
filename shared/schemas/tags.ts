import { z } from 'zod'
import { SHORT_CODE_ALPHABET, SHORT_CODE_LENGTH } from '../constants/grid'
import { uuid } from './params'

/**
 * The token a tag's QR code carries in /t/<token>: base64url, 43 characters (a 16-byte nonce
 * and a 16-byte signature). Anything else is not a tag of ours (the routes answer 404).
 */
export const TAG_TOKEN_PATTERN = /^[\w-]{43}$/
export const tagTokenSchema = z.string().regex(TAG_TOKEN_PATTERN, { error: 'That is not a Gridmark tag.' })
export const tagTokenParamsSchema = z.object({ token: tagTokenSchema })

/** A short code as typed: case, spaces and dashes do not matter ("k7mp-9rtx" → "K7MP9RTX"). */
export function normaliseShortCode(input: string): string {
  return input.toUpperCase().replace(/[\s-]+/g, '')
}

const shortCodeRe = new RegExp(`^[${SHORT_CODE_ALPHABET}]{${SHORT_CODE_LENGTH}}$`)
export const shortCodeSchema = z
  .string({ error: 'Type the tag’s short code.' })
  .transform(normaliseShortCode)
  .refine(s => s.length === SHORT_CODE_LENGTH, { error: `A short code has ${SHORT_CODE_LENGTH} characters, printed under the QR code.` })
  .refine(s => shortCodeRe.test(s), { error: 'A short code uses only the letters and digits printed on tags (no 0, O, 1, I, L, 2, Z, 5, S, 8, B, U, V or Q).' })
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
