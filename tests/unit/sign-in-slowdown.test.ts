// The slowdown before a pause: nothing for the first half of an address's allowance of wrong
// passwords, then a doubling wait, capped so an owner who mistyped is never kept long.
import { describe, expect, it } from 'vitest'
import { slowdownMs } from '../../server/auth/sign-in-guard'

describe('slowdownMs', () => {
  it('costs nothing for the first half of the allowance', () => {
    for (let n = 0; n < 5; n++) expect(slowdownMs(n, 10)).toBe(0)
  })

  it('doubles with each wrong password after that, up to eight seconds', () => {
    const waits = Array.from({ length: 8 }, (_, i) => slowdownMs(5 + i, 10))
    expect(waits).toEqual([250, 500, 1000, 2000, 4000, 8000, 8000, 8000])
  })

  it('starts halfway through whatever allowance is configured', () => {
    expect(slowdownMs(2, 5)).toBe(0)
    expect(slowdownMs(3, 5)).toBe(250)
  })
})
