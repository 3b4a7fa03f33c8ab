// Short codes of glider tags: typed by hand when a QR code will not scan. Random over the
// look-alike-free alphabet; unique per competition by a database constraint, so a clash
// (rare: 22^8 codes) is met by drawing again.
import { randomInt } from 'node:crypto'
import { SHORT_CODE_ALPHABET, SHORT_CODE_LENGTH } from '#shared/constants/grid'

export type ShortCodeGenerator = () => string

/** Uniform over the alphabet (crypto.randomInt has no modulo bias). */
export function randomShortCode(pick: (max: number) => number = randomInt): string {
  let code = ''
  for (let i = 0; i < SHORT_CODE_LENGTH; i++) code += SHORT_CODE_ALPHABET[pick(SHORT_CODE_ALPHABET.length)]
  return code
}

/** "K7MPRTXY" → "K7MP-RTXY", as printed under the QR code. */
export function groupShortCode(code: string): string {
  return `${code.slice(0, 4)}-${code.slice(4)}`
}

export const SHORT_CODE_ATTEMPTS = 5
const SHORT_CODE_CONSTRAINT = 'tags_competition_id_short_code_unique'

export class ShortCodeExhaustedError extends Error {
  constructor(attempts: number) {
    super(`Could not find a free tag short code in ${attempts} attempts; try again.`)
    this.name = 'ShortCodeExhaustedError'
  }
}

function isShortCodeClash(error: unknown): boolean {
  const e = error as { code?: string, constraint?: string } | null
  return e?.code === '23505' && e.constraint === SHORT_CODE_CONSTRAINT
}

/**
 * Runs `insert` with fresh codes until one is free. `insert` must run in its own savepoint, so
 * that a clash does not abort the surrounding transaction. Other errors pass through.
 */
export async function withFreshShortCode<T>(
  insert: (code: string) => Promise<T>,
  generate: ShortCodeGenerator = randomShortCode,
  attempts = SHORT_CODE_ATTEMPTS,
): Promise<T> {
  for (let i = 0; i < attempts; i++) {
    try {
      return await insert(generate())
    }
    catch (error) {
      if (!isShortCodeClash(error)) throw error
    }
  }
  throw new ShortCodeExhaustedError(attempts)
}
