// The one way a schema takes text. Every string the API accepts passes through `text()`, which refuses
// the two things no stored text may hold: NUL (PostgreSQL cannot keep it in text or JSON) and an
// unpaired UTF-16 surrogate (half a character: PostgreSQL refuses it in JSON and it would turn into
// a replacement mark in text). ESLint keeps `z.string()` out of the schemas, so a new field gets this
// check by being written the usual way.
import { z } from 'zod'

// A NUL, a high surrogate not followed by a low one, or a low surrogate not preceded by a high one.
const UNSAFE = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/

export const UNSAFE_TEXT_MESSAGE = 'This text holds a character we cannot keep (a NUL or a broken symbol). Retype it and try again.'

/** True when the string holds a NUL or half of a surrogate pair. */
export function hasUnsafeCharacters(value: string): boolean {
  return UNSAFE.test(value)
}

/**
 * `z.string()` that refuses NUL and unpaired surrogates before any other check, with a message the
 * form can show beside the field. Chain `.trim()`, `.min()`, `.max()` and the rest as usual.
 */
export function text(params?: Parameters<typeof z.string>[0]) {
  // eslint-disable-next-line no-restricted-syntax -- the one place a bare string schema is made
  return z.string(params).refine((value) => !hasUnsafeCharacters(value), { error: UNSAFE_TEXT_MESSAGE, abort: true })
}
