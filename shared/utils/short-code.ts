// Tag tokens and short codes as plain functions, without zod: the launch-grid page reads them
// on the phone before anything else loads (shared/schemas/tags.ts builds its schemas on these).
import { SHORT_CODE_ALPHABET, SHORT_CODE_LENGTH } from '../constants/grid'

/**
 * The token a tag's QR code carries in /t/<token>: base64url, 43 characters (a 16-byte nonce
 * and a 16-byte signature). Anything else is not a tag of ours (the routes answer 404).
 */
export const TAG_TOKEN_PATTERN = /^[\w-]{43}$/

/** A short code as typed: case, spaces and dashes do not matter ("k7mp-9rtx" → "K7MP9RTX"). */
export function normaliseShortCode(input: string): string {
  return input.toUpperCase().replace(/[\s-]+/g, '')
}

export const SHORT_CODE_PROBLEMS = {
  missing: 'Type the tag’s short code.',
  length: `A short code has ${SHORT_CODE_LENGTH} characters, printed under the QR code.`,
  characters: 'A short code uses only the letters and digits printed on tags (no 0, O, 1, I, L, 2, Z, 5, S, 8, B, U, V or Q).',
} as const

const shortCodeRe = new RegExp(`^[${SHORT_CODE_ALPHABET}]{${SHORT_CODE_LENGTH}}$`)

/** What is wrong with a normalised short code, or null when it is one. */
export function shortCodeProblem(code: string): string | null {
  if (code.length !== SHORT_CODE_LENGTH) return SHORT_CODE_PROBLEMS.length
  return shortCodeRe.test(code) ? null : SHORT_CODE_PROBLEMS.characters
}
