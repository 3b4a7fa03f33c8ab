import { describe, expect, it } from 'vitest'
import { FAI_CLASSES } from '#shared/constants/classes'
import { classMatches, gliderTypesMatch, namesMatch, normaliseId } from '#shared/engine/normalise'

describe('normalising registrations and competition IDs', () => {
  it('ignores case, spaces and hyphens ("D-1234" = "d1234")', () => {
    expect(normaliseId('D-1234')).toBe(normaliseId('d1234'))
    expect(normaliseId(' km abc ')).toBe('KMABC')
  })
})

describe('class names and their usual spellings', () => {
  it.each(['18m', '18 Metre', '18-Meter', '18 meter', '18M'])('%s is the 18 Metre class', (s) => {
    expect(classMatches(s, '18m', '18 Metre')).toBe(true)
  })

  it('knows every FAI class by its own aliases (shared/constants/classes.ts)', () => {
    for (const c of FAI_CLASSES) for (const a of [c.name, ...c.aliases]) expect(classMatches(a, c.code, c.name), `${c.code}: ${a}`).toBe(true)
  })

  it('keeps different classes apart', () => {
    expect(classMatches('15m', '18m', '18 Metre')).toBe(false)
    expect(classMatches('Standard', '15m', '15 Metre')).toBe(false)
    expect(classMatches('', 'club', 'Club')).toBe(false)
  })

  it('takes a competition’s own aliases', () => {
    expect(classMatches('Twin', '20m-two-seater', '20 Metre Two-Seater', ['Twin'])).toBe(true)
  })
})

describe('tolerant comparison of names', () => {
  it('ignores case, diacritics, punctuation and the order "Surname Name"', () => {
    expect(namesMatch('BLOGGS Bill', 'Bill Bloggs')).toBe(true)
    expect(namesMatch('Zoë Ångström-Ørsted', 'angstrom orsted zoe')).toBe(false) // ø is a letter of its own, not o with a mark
    expect(namesMatch('Zoë Ångström', 'angstrom zoe')).toBe(true)
  })

  it('lets a middle initial on one side pass ("Bloggs Bill D" = "Bill Bloggs")', () => {
    expect(namesMatch('Bloggs Bill D', 'Bill Bloggs')).toBe(true)
  })

  it('does not take a different name', () => {
    expect(namesMatch('Bloggs Bill', 'Bloggs Ben')).toBe(false)
    expect(namesMatch(null, 'Bill Bloggs')).toBe(false)
  })

  it('compares glider types without spacing or punctuation, with or without the maker', () => {
    expect(gliderTypesMatch('TARN-15', 'Tarn 15')).toBe(true)
    expect(gliderTypesMatch('Moorworks Tarn 15', 'Tarn 15')).toBe(true)
    expect(gliderTypesMatch('Tarn 15', 'Tarn 18')).toBe(false)
  })
})
