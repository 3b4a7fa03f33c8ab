// The client's address behind a configured number of trusted proxies.
import { describe, expect, it } from 'vitest'
import { addressBehindProxies, trustedHops } from '../../../../server/utils/client-address'

describe('the client behind trusted proxies', () => {
  it('takes the address the one trusted proxy saw, never what the client wrote further left', () => {
    expect(addressBehindProxies('203.0.113.7', '10.0.0.2', 1)).toBe('203.0.113.7')
    // The client sent "X-Forwarded-For: 1.2.3.4" itself; the proxy appended the real address.
    expect(addressBehindProxies('1.2.3.4, 203.0.113.7', '10.0.0.2', 1)).toBe('203.0.113.7')
  })

  it('walks past as many proxies as are trusted', () => {
    // client → proxy A (10.0.0.1) → proxy B (the socket's peer, 10.0.0.2) → app
    expect(addressBehindProxies('6.6.6.6, 203.0.113.7, 10.0.0.1', '10.0.0.2', 2)).toBe('203.0.113.7')
  })

  it('gives the leftmost address of a chain shorter than the trusted hops, and the socket without a header', () => {
    expect(addressBehindProxies('203.0.113.7', '10.0.0.2', 3)).toBe('203.0.113.7')
    expect(addressBehindProxies(undefined, '10.0.0.2', 1)).toBe('10.0.0.2')
  })

  it('trusts no proxy unless told, and reads the older switch as one', () => {
    expect(trustedHops(0, false)).toBe(0)
    expect(trustedHops('', 'false')).toBe(0)
    expect(trustedHops('2', false)).toBe(2)
    expect(trustedHops(0, 'true')).toBe(1)
    expect(trustedHops('-1', false)).toBe(0)
  })
})
