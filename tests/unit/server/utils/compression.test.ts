// Which Accept-Encoding headers take gzip, as RFC 9110 §12.5.3 (Accept-Encoding) and §12.4.2
// (quality values) define them.
import { describe, expect, it } from 'vitest'
import { acceptsGzip } from '../../../../server/utils/compression'

describe('acceptsGzip (RFC 9110 §12.5.3)', () => {
  it('takes gzip when it is named, with or without a weight above 0', () => {
    expect(acceptsGzip('gzip')).toBe(true)
    expect(acceptsGzip('gzip, deflate, br, zstd')).toBe(true) // what browsers send (common practice)
    expect(acceptsGzip('br;q=1.0, gzip;q=0.8, *;q=0.1')).toBe(true) // the RFC's example
    expect(acceptsGzip('x-gzip')).toBe(true) // §8.4.1.3: x-gzip is an alias of gzip
    expect(acceptsGzip('GZIP; Q=0.5')).toBe(true) // tokens and parameter names are case-insensitive
  })

  it('refuses gzip with q=0, when only others are named, or when nothing is said', () => {
    expect(acceptsGzip('gzip;q=0')).toBe(false)
    expect(acceptsGzip('gzip;q=0.000, *')).toBe(false) // a named coding outranks the wildcard
    expect(acceptsGzip('deflate, br')).toBe(false)
    expect(acceptsGzip('identity')).toBe(false)
    expect(acceptsGzip('')).toBe(false)
    expect(acceptsGzip(undefined)).toBe(false)
  })

  it('reads the wildcard when gzip is not named', () => {
    expect(acceptsGzip('*')).toBe(true)
    expect(acceptsGzip('br, *;q=0.1')).toBe(true)
    expect(acceptsGzip('br, *;q=0')).toBe(false)
  })
})
