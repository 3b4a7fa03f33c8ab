// Tag short codes: typed by hand on the grid, so no look-alike characters; unique per
// competition, a clash is met by drawing again, and a run of clashes ends in a clear error.
import { describe, expect, it } from 'vitest'
import { SHORT_CODE_ALPHABET, SHORT_CODE_LENGTH } from '#shared/constants/grid'
import { normaliseShortCode, shortCodeSchema } from '#shared/schemas/tags'
import { groupShortCode, randomShortCode, SHORT_CODE_ATTEMPTS, ShortCodeExhaustedError, withFreshShortCode } from '#domain/tags/short-code'

/** What PostgreSQL reports for a duplicate (competition_id, short_code). */
const clash = () => Object.assign(new Error('duplicate key value violates unique constraint'), { code: '23505', constraint: 'tags_competition_id_short_code_unique' })

describe('short-code alphabet', () => {
  it('has 22 distinct characters and none of the look-alikes 0 O Q 1 I L 2 Z 5 S 8 B U V (common practice)', () => {
    expect(SHORT_CODE_ALPHABET).toHaveLength(22)
    expect(new Set(SHORT_CODE_ALPHABET).size).toBe(22)
    for (const c of '0OQ1IL2Z5S8BUV') expect(SHORT_CODE_ALPHABET).not.toContain(c)
  })
})

describe('randomShortCode', () => {
  it('draws 8 characters of the alphabet', () => {
    for (let i = 0; i < 200; i++) {
      const code = randomShortCode()
      expect(code).toHaveLength(SHORT_CODE_LENGTH)
      for (const c of code) expect(SHORT_CODE_ALPHABET).toContain(c)
    }
  })

  it('uses every character of the alphabet over many draws', () => {
    const seen = new Set(Array.from({ length: 300 }, () => randomShortCode()).join(''))
    expect(seen.size).toBe(SHORT_CODE_ALPHABET.length)
  })

  it('prints grouped as XXXX-XXXX', () => {
    expect(groupShortCode('K7MP9RTX')).toBe('K7MP-9RTX')
  })
})

describe('normalising a typed code', () => {
  it('accepts lower case with a dash or spaces', () => {
    expect(normaliseShortCode('k7mp-9rtx')).toBe('K7MP9RTX')
    expect(shortCodeSchema.parse(' k7mp 9rtx ')).toBe('K7MP9RTX')
  })

  it('refuses a wrong length and look-alike characters with a message', () => {
    expect(shortCodeSchema.safeParse('K7MP9RT').success).toBe(false)
    const look = shortCodeSchema.safeParse('K7MP9RT0')
    expect(look.success).toBe(false)
    expect(look.error?.issues[0]?.message).toMatch(/only the letters and digits printed on tags/)
  })
})

describe('withFreshShortCode', () => {
  it('retries with a new code when the first one is taken in the competition', async () => {
    const codes = ['AAAAAAAA', 'CCCCCCCC']
    const tried: string[] = []
    const result = await withFreshShortCode(async (code) => {
      tried.push(code)
      if (code === 'AAAAAAAA') throw clash()
      return code
    }, () => codes.shift()!)
    expect(tried).toEqual(['AAAAAAAA', 'CCCCCCCC'])
    expect(result).toBe('CCCCCCCC')
  })

  it(`gives up after ${SHORT_CODE_ATTEMPTS} clashes with a clear error`, async () => {
    let attempts = 0
    const run = withFreshShortCode(async () => {
      attempts++
      throw clash()
    }, () => 'AAAAAAAA')
    await expect(run).rejects.toBeInstanceOf(ShortCodeExhaustedError)
    await expect(run).rejects.toThrow(/free tag short code/)
    expect(attempts).toBe(SHORT_CODE_ATTEMPTS)
  })

  it('does not retry other errors, not even other unique violations', async () => {
    let attempts = 0
    const other = Object.assign(new Error('duplicate'), { code: '23505', constraint: 'tags_token_hash_unique' })
    await expect(withFreshShortCode(async () => {
      attempts++
      throw other
    })).rejects.toBe(other)
    expect(attempts).toBe(1)
  })
})
