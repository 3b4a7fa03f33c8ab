// The pack a grid page loaded whole came with, against the one kept on the phone: the newer
// wins, so a copy of the page the worker kept from an earlier visit never shows an older pack
// than the phone holds (common practice of offline-first apps: the newest copy counts).
import { describe, expect, it } from 'vitest'
import { servedPackUse } from '~/utils/servedPack'

const at = (generatedAt: string) => ({ generatedAt })

describe('servedPackUse', () => {
  it('takes the page’s pack when the phone keeps none', () => {
    expect(servedPackUse(at('2027-07-12T07:00:00.000Z'), undefined)).toBe('served')
  })
  it('takes the page’s pack when it is newer than the kept one (just rendered by the server)', () => {
    expect(servedPackUse(at('2027-07-12T07:00:00.001Z'), at('2027-07-12T07:00:00.000Z'))).toBe('served')
  })
  it('takes the kept pack when the page is an older copy', () => {
    expect(servedPackUse(at('2027-07-12T06:59:59.999Z'), at('2027-07-12T07:00:00.000Z'))).toBe('kept')
    expect(servedPackUse(at('2027-07-11T09:00:00.000Z'), at('2027-07-12T07:00:00.000Z'))).toBe('kept')
  })
  it('says the same when both are one pack', () => {
    expect(servedPackUse(at('2027-07-12T07:00:00.000Z'), at('2027-07-12T07:00:00.000Z'))).toBe('same')
  })
  it('compares instants, not text (an offset written otherwise)', () => {
    expect(servedPackUse(at('2027-07-12T09:00:00+02:00'), at('2027-07-12T07:00:00.000Z'))).toBe('same')
  })
})
