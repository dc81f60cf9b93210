// A form that reads its values through a shared schema on every change shows each complaint beside
// its field, in the units on screen, keyed by the field's name as the form names it.

import type { ZodError } from 'zod'
import { localiseMessage, type UnitSystem } from './units'

/** Field name (as the form names it) → the schema's message, in the units on screen. */
export type FieldMessages = Record<string, string>

type Issue = ZodError['issues'][number]

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value = root
  for (const key of path) value = typeof value === 'object' && value !== null ? (value as Record<PropertyKey, unknown>)[key] : undefined
  return value
}

/**
 * A union that fails names no field ("give the deposit as a percent or a fixed sum"). The branch
 * meant is the one whose complaints are all about fields the form gave; its messages are the useful ones.
 */
function branchMeant(issue: Issue, input: unknown): Issue[] | null {
  if (issue.code !== 'invalid_union') return null
  const given = valueAt(input, issue.path)
  if (typeof given !== 'object' || given === null) return null
  const keys = Object.keys(given)
  const branch = issue.errors.find((issues) => issues.length > 0 && issues.every((nested) => keys.includes(String(nested.path[0]))))
  return branch ? branch.map((nested) => ({ ...nested, path: [...issue.path, ...nested.path] })) : null
}

/** Adds the error's messages under `prefix` + the issue's path ("_" for the whole), the first per field. */
export function collectMessages(messages: FieldMessages, error: ZodError, input: unknown, prefix: string, units: UnitSystem) {
  for (const issue of error.issues) {
    for (const meant of branchMeant(issue, input) ?? [issue]) {
      const key = prefix + meant.path.map(String).join('.')
      messages[key || '_'] ??= localiseMessage(meant.message, units)
    }
  }
}
