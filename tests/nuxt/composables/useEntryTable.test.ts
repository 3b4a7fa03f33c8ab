import { describe, expect, it } from 'vitest'
import { entryExportUrl, entryTableQuery } from '~/composables/useEntryTable'

describe('entries table addresses', () => {
  it('keeps only set parameters, and the export drops paging', () => {
    expect(entryTableQuery({ q: '', status: 'accepted', page: 2 })).toEqual({ status: 'accepted', page: '2' })
    expect(entryExportUrl('c1', { q: 'kes', page: 3, pageSize: 25, sort: 'pilot' })).toBe('/api/competitions/c1/entries/export?q=kes&sort=pilot')
  })
})
