// The one text check every schema uses. What counts as unsafe comes from outside the project: the
// PostgreSQL manual (8.3, Character Types: "the character with code zero (sometimes called NUL)
// cannot be stored") and the Unicode Standard (3.8, D71–D75: high surrogates U+D800–U+DBFF must be
// followed by a low surrogate U+DC00–U+DFFF, and a low one must follow a high one).
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { registerSchema } from '../../shared/schemas/auth'
import { pieceSchema } from '../../shared/schemas/firing'
import { messageSchema } from '../../shared/schemas/requests'
import { hasUnsafeCharacters, text, UNSAFE_TEXT_MESSAGE } from '../../shared/schemas/text'

// Single UTF-16 code units (lone surrogates and NUL included) mixed with whole code points.
const utf16Unit = fc.oneof(
  fc.nat(0xffff).map((unit) => String.fromCharCode(unit)),
  fc.integer({ min: 0xd800, max: 0xdfff }).map((unit) => String.fromCharCode(unit)),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 1 }),
)

describe('hasUnsafeCharacters', () => {
  it('finds a NUL anywhere', () => {
    expect(hasUnsafeCharacters('\u0000')).toBe(true)
    expect(hasUnsafeCharacters('kiln\u0000')).toBe(true)
    expect(hasUnsafeCharacters('\u0000kiln')).toBe(true)
  })

  it('finds a high surrogate with no low one after it, and a low one with no high one before it', () => {
    expect(hasUnsafeCharacters('\ud800')).toBe(true)
    expect(hasUnsafeCharacters('a\udbffb')).toBe(true)
    expect(hasUnsafeCharacters('\udc00')).toBe(true)
    expect(hasUnsafeCharacters('a\udfff')).toBe(true)
    // A pair in the wrong order is two unpaired halves.
    expect(hasUnsafeCharacters('\udc00\ud800')).toBe(true)
  })

  it('accepts characters outside the Basic Multilingual Plane, which are proper surrogate pairs', () => {
    // U+1F3FA AMPHORA is D83C DFFA in UTF-16 (Unicode code chart for U+1F300–U+1F5FF).
    expect('\u{1F3FA}').toBe('\ud83c\udffa')
    expect(hasUnsafeCharacters('Glaze \u{1F3FA} and \u{1F525}')).toBe(false)
    expect(hasUnsafeCharacters('Ça, 東京, עברית, tab\tand newline\n')).toBe(false)
  })

  it('agrees with String.prototype.isWellFormed (ES2024) on every string, NUL aside', () => {
    fc.assert(
      fc.property(fc.string({ unit: utf16Unit }), (s) => {
        const wellFormed = (s as string & { isWellFormed(): boolean }).isWellFormed()
        expect(hasUnsafeCharacters(s)).toBe(!wellFormed || s.includes('\u0000'))
      }),
      { numRuns: 2000 },
    )
  })
})

describe('text()', () => {
  it('refuses before any other check, with the one message the form shows', () => {
    const result = text().trim().min(5).safeParse('\u0000')
    expect(result.success).toBe(false)
    expect(result.error!.issues).toHaveLength(1)
    expect(result.error!.issues[0].message).toBe(UNSAFE_TEXT_MESSAGE)
  })

  it('still trims and bounds as before', () => {
    expect(text().trim().max(5).parse('  bowl  ')).toBe('bowl')
    expect(text().max(3).safeParse('bowls').success).toBe(false)
  })

  it('guards the fields of the shared schemas: piece labels, messages and e-mail addresses', () => {
    const piece = {
      label: 'Mug \ud800',
      quantity: 1,
      heightMm: 100,
      widthMm: 90,
      depthMm: 90,
      wallThicknessMm: 6,
      clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
      state: 'bisque',
    }
    expect(pieceSchema.safeParse(piece).error?.issues[0]).toMatchObject({ path: ['label'], message: UNSAFE_TEXT_MESSAGE })
    expect(pieceSchema.safeParse({ ...piece, label: 'Mug' }).success).toBe(true)
    expect(messageSchema.safeParse({ body: 'ready?\u0000' }).error?.issues[0].message).toBe(UNSAFE_TEXT_MESSAGE)
    const register = registerSchema.safeParse({
      email: 'a\u0000@example.test',
      password: 'long-enough-1',
      displayName: 'A',
      role: 'potter',
    })
    expect(register.error?.issues[0]).toMatchObject({ path: ['email'], message: UNSAFE_TEXT_MESSAGE })
  })
})
