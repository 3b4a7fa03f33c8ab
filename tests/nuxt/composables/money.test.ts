import { describe, expect, it } from 'vitest'
import { formatMoney, fromMinorUnits, toMinorUnits } from '~/composables/money'
import { entryExportUrl, entryTableQuery } from '~/composables/useEntryTable'

describe('money in forms', () => {
  it('reads major units into minor units, refusing what is not an amount', () => {
    expect(toMinorUnits('320')).toBe(32000)
    expect(toMinorUnits('320,5')).toBe(32050)
    expect(toMinorUnits(' 0.07 ')).toBe(7)
    expect(toMinorUnits('')).toBe(0)
    expect(toMinorUnits('12.345')).toBeNaN()
    expect(toMinorUnits('ten')).toBeNaN()
    expect(fromMinorUnits(4500)).toBe('45.00')
    expect(formatMoney(32000, 'EUR')).toBe('€320.00')
  })
})

describe('entries table addresses', () => {
  it('keeps only set parameters, and the export drops paging', () => {
    expect(entryTableQuery({ q: '', status: 'accepted', page: 2 })).toEqual({ status: 'accepted', page: '2' })
    expect(entryExportUrl('c1', { q: 'kes', page: 3, pageSize: 25, sort: 'pilot' })).toBe('/api/competitions/c1/entries/export?q=kes&sort=pilot')
  })
})
