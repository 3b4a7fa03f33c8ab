import { describe, expect, it } from 'vitest'
import { radioIdFormat, radioIdRegistration, radioIdUnique } from '#shared/engine/checks/radio-id'
import { collisionWarning, ctx, dossier, fieldOf } from '../builders'

const withRadio = (radioId: string | null, entry = {}) => dossier({ units: [collisionWarning({ radioId })] }, entry)

describe('radio-id.format (ICAO Annex 10 Vol III ch. 9: the 24-bit address)', () => {
  it.each(['3D2F1A', '3d2f1a', 'A00001'])('passes %s', (id) => {
    expect(radioIdFormat.run(ctx(withRadio(id)))).toEqual([])
  })

  it.each([['000000', 'reserved'], ['FFFFFF', 'reserved'], ['3D2F1', 'six hexadecimal'], ['3D2F1G', 'six hexadecimal'], [null, 'not entered']])('blocks %s', (id, words) => {
    const [f] = radioIdFormat.run(ctx(withRadio(id)))
    expect(f).toMatchObject({ severity: 'blocking', unitId: 'cw-1' })
    expect(f!.reason).toContain(words)
  })
})

describe('radio-id.unique (common practice)', () => {
  it('blocks both entries that share a radio ID, naming the other entry', () => {
    const b2 = withRadio('3E91C4', { id: 'b2', compId: 'B2' })
    const m5 = withRadio('3e91c4', { id: 'm5', compId: 'M5' })
    const field = fieldOf(b2, m5)
    const [f] = radioIdUnique.run(ctx(b2, undefined, field))
    expect(f).toMatchObject({ severity: 'blocking' })
    expect(f!.reason).toContain('3E91C4')
    expect(f!.reason).toContain('M5')
    // The address is named once: the unit by its model, not again by its radio ID.
    expect(f!.reason.match(/3E91C4/g)).toHaveLength(1)
    expect(radioIdUnique.run(ctx(m5, undefined, field))[0]!.reason).toContain('B2')
  })

  it('passes unique IDs, and ignores withdrawn entries in the field', () => {
    const a = withRadio('3E91C4', { id: 'a', compId: 'A1' })
    const b = withRadio('3E91C4', { id: 'b', compId: 'B2', status: 'withdrawn' })
    const c = withRadio('3E91C5', { id: 'c', compId: 'C3' })
    expect(radioIdUnique.run(ctx(a, undefined, fieldOf(a, b, c)))).toEqual([])
  })
})

describe('radio-id.registration (the published N-number → ICAO address mapping)', () => {
  it('advises when a US glider’s radio ID differs from its registration’s address (N12345 → A061D9)', () => {
    const [f] = radioIdRegistration.run(ctx(withRadio('A061DA', { registration: 'N12345' })))
    expect(f).toMatchObject({ severity: 'advisory' })
    expect(f!.reason).toContain('A061D9')
    expect(f!.reason.match(/A061DA/g)).toHaveLength(1)
  })

  it('passes the matching address and registrations that are not N-numbers', () => {
    expect(radioIdRegistration.run(ctx(withRadio('A061D9', { registration: 'n-12345' })))).toEqual([])
    expect(radioIdRegistration.run(ctx(withRadio('3D2F1A', { registration: 'KM-ABC' })))).toEqual([])
  })
})
