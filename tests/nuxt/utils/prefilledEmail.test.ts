import { describe, expect, it } from 'vitest'
import { prefilledEmail } from '~/utils/prefilledEmail'

describe('prefilledEmail', () => {
  it('takes an address from the query, trimmed, the first of several', () => {
    expect(prefilledEmail(' vera@example.org ')).toBe('vera@example.org')
    expect(prefilledEmail(['a@example.org', 'b@example.org'])).toBe('a@example.org')
  })

  it.each(['', 'not an address', 'a b@example.org', `${'x'.repeat(250)}@example.org`, undefined, 42, null])(
    'fills in nothing for %s',
    value => expect(prefilledEmail(value)).toBeUndefined(),
  )
})
