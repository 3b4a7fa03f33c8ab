import { describe, expect, it } from 'vitest'
import { isNNumber, nNumberToAddress } from '#shared/engine/nnumber'

// Source: the published US N-number → ICAO 24-bit address mapping, with example pairs as
// documented in the README of the open-source icao-nnumber_converter project.
describe('N-number → 24-bit address', () => {
  it.each([
    ['N1', 'A00001'],
    ['N1A', 'A00002'],
    ['N1AA', 'A00003'],
    ['N1B', 'A0001B'],
    ['N10', 'A0025A'],
    ['N100', 'A004B3'],
    ['N1000', 'A0070C'],
    ['N11', 'A029D9'],
    ['N12345', 'A061D9'],
    ['N2', 'A18D50'],
    ['N99999', 'ADF7C7'],
  ])('%s → %s', (registration, address) => {
    expect(nNumberToAddress(registration)).toBe(address)
  })

  it('accepts case, spaces and hyphens ("n-12345")', () => {
    expect(nNumberToAddress('n-12345')).toBe('A061D9')
  })

  it('rejects what is not an N-number: I and O never occur, no leading zero, at most five characters after N', () => {
    for (const r of ['N1I', 'N1O', 'N0', 'N123456', 'N12345A', 'N1234AB', 'D-1234', 'N', 'NA1']) {
      expect(isNNumber(r), r).toBe(false)
      expect(nNumberToAddress(r)).toBeNull()
    }
  })

  it('gives every N-number its own address, in increasing order (sampled)', () => {
    const regs = ['N1', 'N1A', 'N1AZ', 'N1B', 'N1Z', 'N1ZZ', 'N10', 'N100', 'N1000', 'N1000A', 'N10000', 'N1001', 'N1009', 'N1009Z', 'N101', 'N11', 'N19999', 'N2', 'N99999']
    const addresses = regs.map(r => Number.parseInt(nNumberToAddress(r)!, 16))
    expect([...addresses].sort((a, b) => a - b)).toEqual(addresses)
    expect(new Set(addresses).size).toBe(addresses.length)
  })

  it('walks the N1… and N9… branches in sequence with no gap, ending at N99999 = ADF7C7', () => {
    // Our own enumeration of the order the mapping defines: a number, its letter suffixes, then its digits.
    const L = 'ABCDEFGHJKLMNPQRSTUVWXYZ'
    let expected = 0xA00001
    let count = 0
    const visit = (reg: string): void => {
      if (nNumberToAddress(reg) !== (expected++).toString(16).toUpperCase()) throw new Error(reg)
      count++
      const digits = reg.length - 1
      if (digits <= 3) {
        for (const a of L) {
          const one = reg + a
          if (nNumberToAddress(one) !== (expected++).toString(16).toUpperCase()) throw new Error(one)
          for (const b of L) {
            if (nNumberToAddress(one + b) !== (expected++).toString(16).toUpperCase()) throw new Error(one + b)
          }
        }
      }
      else if (digits === 4) {
        for (const a of L) {
          if (nNumberToAddress(reg + a) !== (expected++).toString(16).toUpperCase()) throw new Error(reg + a)
        }
      }
      if (digits < 5) for (let d = 0; d <= 9; d++) visit(reg + d)
    }
    visit('N1')
    expect((expected).toString(16).toUpperCase()).toBe(nNumberToAddress('N2'))
    expected = Number.parseInt(nNumberToAddress('N9')!, 16)
    visit('N9')
    expect(count).toBe(2 * 11111)
    expect((expected - 1).toString(16).toUpperCase()).toBe('ADF7C7')
  }, 30_000)
})
