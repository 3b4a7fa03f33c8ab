// Scrutineers are shown by their initials on the board and the desk.
import { describe, expect, it } from 'vitest'
import { initialsOf } from '../../../../shared/utils/initials'

describe('initialsOf', () => {
  it('makes initials from the first and last name', () => {
    expect(initialsOf('ada')).toBe('A')
    expect(initialsOf(' Tom Second Scrutineer ')).toBe('TS')
    expect(initialsOf('')).toBe('?')
  })
})
