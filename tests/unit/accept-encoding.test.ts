import { describe, expect, it } from 'vitest'
import { accepts } from '../../server/http/client-files'

// Accept-Encoding as RFC 9110 §12.5.3 defines it; the header values are the RFC's own examples and
// what Chromium and Firefox send (from memory).
describe('accepts (Accept-Encoding)', () => {
  it('takes an encoding a browser names', () => {
    expect(accepts('gzip, deflate, br, zstd', 'br')).toBe(true)
    expect(accepts('gzip, deflate, br, zstd', 'gzip')).toBe(true)
    expect(accepts('gzip, deflate', 'br')).toBe(false)
  })

  it('follows q-values: zero refuses, any other weight takes', () => {
    expect(accepts('gzip;q=1.0, identity; q=0.5, *;q=0', 'gzip')).toBe(true)
    expect(accepts('gzip;q=1.0, identity; q=0.5, *;q=0', 'br')).toBe(false)
    expect(accepts('br;q=0, gzip', 'br')).toBe(false)
    expect(accepts('br ; q=0.2', 'br')).toBe(true)
  })

  it('takes anything for `*` unless named with q=0, and nothing without the header', () => {
    expect(accepts('*', 'br')).toBe(true)
    expect(accepts('br;q=0, *', 'br')).toBe(false)
    expect(accepts(undefined, 'gzip')).toBe(false)
    expect(accepts('', 'gzip')).toBe(false)
  })
})
