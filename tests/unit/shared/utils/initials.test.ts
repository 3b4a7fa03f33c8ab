// Scrutineers are shown by their initials on the desk, by initial and surname on the board.
import { describe, expect, it } from 'vitest'
import { initialsOf, shortNameOf } from '../../../../shared/utils/initials'

describe('initialsOf', () => {
  it('makes initials from the first and last name', () => {
    expect(initialsOf('ada')).toBe('A')
    expect(initialsOf(' Tom Second Scrutineer ')).toBe('TS')
    expect(initialsOf('')).toBe('?')
  })
})

describe('shortNameOf', () => {
  it('gives the first initial and the last name, never capitals alone', () => {
    expect(shortNameOf('Sam Scrutineer')).toBe('S. Scrutineer')
    expect(shortNameOf(' tom Second Scrutineer ')).toBe('T. Scrutineer')
    expect(shortNameOf('Ada')).toBe('Ada')
    expect(shortNameOf('')).toBe('?')
  })
})
