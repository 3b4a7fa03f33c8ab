// Money in integer minor units: read from forms, shown to people.
import { describe, expect, it } from 'vitest'
import { formatMoney, fromMinorUnits, toMinorUnits } from '../../../../shared/utils/money'

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

describe('formatMoney', () => {
  it('falls back to the amount and the code when the currency is not one Intl knows', () => {
    expect(formatMoney(32050, 'XX')).toBe('320.50 XX')
  })
})
