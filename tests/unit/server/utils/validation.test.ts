// Control characters in any text of a request: found with their path, refused with the field named.
import { describe, expect, it } from 'vitest'
import type { H3Error } from 'h3'
import { assertPlainText, controlCharacterPath, hasControlCharacter } from '../../../../server/utils/validation'

describe('control characters in a request', () => {
  it('keeps tabs and line breaks (CRLF of pasted text and CSV files included), refuses the others', () => {
    expect(hasControlCharacter('Wing\troot\nleft\r\nright')).toBe(false)
    expect(hasControlCharacter('Élan Ø 15 m — “ok” 😀')).toBe(false)
    for (const c of ['\u0000', '\u0007', '\u000B', '\u001B', '\u007F', '\u0085', '\u009F']) {
      expect(hasControlCharacter(`a${c}b`), JSON.stringify(c)).toBe(true)
    }
  })

  it('names the path of the first text holding one, keys included', () => {
    expect(controlCharacterPath({ name: 'ok', units: [{ model: 'ok' }, { model: 'CW\u0000' }] })).toEqual(['units', 1, 'model'])
    expect(controlCharacterPath({ ['bad\u0000key']: 1 })).toEqual(['bad\u0000key'])
    expect(controlCharacterPath({ n: 1, ok: true, none: null, list: ['a'] })).toBeUndefined()
    expect(controlCharacterPath('\u0000')).toEqual([])
  })

  it('answers 400 with the field beside which a form shows it', () => {
    let error: H3Error | undefined
    try {
      assertPlainText({ notes: 'ok', answers: [{ itemId: 'antennas', note: 'x\u0000' }] })
    }
    catch (err) {
      error = err as H3Error
    }
    expect(error?.statusCode).toBe(400)
    expect(error?.message).toContain('“answers.0.note”')
    expect(error?.data).toEqual({ fieldErrors: { answers: [expect.stringContaining('control character')] }, formErrors: [] })
  })
})
