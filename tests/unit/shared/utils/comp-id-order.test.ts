// Competition IDs read in the order people expect on a board: numbers by value before letters,
// letters with numbers by value (common practice on contest grids and result lists).
import { describe, expect, it } from 'vitest'
import { compareCompIds } from '#shared/utils/comp-id-order'

describe('compareCompIds', () => {
  it('sorts numbers by value, then letters, numbers inside by value, case aside', () => {
    const ids = ['AB', '12', 'a10', '3', 'K5', '33', 'A2', '7', '1A', 'A1']
    expect([...ids].sort(compareCompIds)).toEqual(['1A', '3', '7', '12', '33', 'A1', 'A2', 'a10', 'AB', 'K5'])
  })
})
