// How the stand-in reads fields out of a stored document, following the engine's rules: nested
// objects are addressed with dotted paths (`kiln.heightMm`), arrays are flattened so that every
// element is a value of the same field, and facet strings compare trimmed, NFKD-normalised and
// lower-cased (milli `normalize_facet`).

export type JsonObject = Record<string, unknown>

/** Everything a document holds under one dotted path. */
export interface FieldValues {
  /** Scalar values (numbers, strings, booleans), array elements included. */
  values: Array<number | string | boolean>
  /** The field itself is `null`. */
  isNull: boolean
  /** The field itself is `""`, `[]` or `{}`. */
  isEmpty: boolean
}

export type FlatDocument = Map<string, FieldValues>

function entryFor(flat: FlatDocument, path: string): FieldValues {
  let entry = flat.get(path)
  if (!entry) {
    entry = { values: [], isNull: false, isEmpty: false }
    flat.set(path, entry)
  }
  return entry
}

function visit(flat: FlatDocument, path: string, value: unknown, direct: boolean): void {
  const entry = entryFor(flat, path)
  if (value === null || value === undefined) {
    if (direct) entry.isNull = true
  } else if (Array.isArray(value)) {
    if (value.length === 0 && direct) entry.isEmpty = true
    for (const element of value) visit(flat, path, element, false)
  } else if (typeof value === 'object') {
    const members = Object.entries(value as JsonObject)
    if (members.length === 0 && direct) entry.isEmpty = true
    for (const [key, member] of members) visit(flat, `${path}.${key}`, member, true)
  } else if (typeof value === 'number' || typeof value === 'string' || typeof value === 'boolean') {
    if (value === '' && direct) entry.isEmpty = true
    entry.values.push(value)
  }
}

/** Every path of a document with the values found there (intermediate objects are paths too). */
export function flattenDocument(document: JsonObject): FlatDocument {
  const flat: FlatDocument = new Map()
  for (const [key, value] of Object.entries(document)) visit(flat, key, value, true)
  return flat
}

/** milli `normalize_facet`: trim, compatibility decomposition, lower case. */
export function normalizeFacet(text: string): string {
  return text.trim().normalize('NFKD').toLowerCase()
}

/** Facet strings as the engine stores them: booleans become "true"/"false". */
export function facetString(value: number | string | boolean): string | null {
  if (typeof value === 'string') return value
  if (typeof value === 'boolean') return String(value)
  return null
}

/**
 * Whether an attribute is covered by a settings pattern: the attribute itself, anything nested
 * below it (`kiln` covers `kiln.heightMm`), or a `*` wildcard pattern.
 */
export function patternCovers(pattern: string, attribute: string): boolean {
  if (pattern === '*' || pattern === attribute || attribute.startsWith(`${pattern}.`)) return true
  if (!pattern.includes('*')) return false
  const expression = new RegExp(`^${pattern.split('*').map(escapeRegExp).join('.*')}$`)
  return expression.test(attribute)
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
}

const DOCUMENT_ID = /^[a-zA-Z0-9_-]+$/

/** The external id as the engine keys it, or null when the engine would reject the value. */
export function documentIdKey(value: unknown): string | null {
  if (typeof value === 'number') return Number.isSafeInteger(value) ? String(value) : null
  if (typeof value === 'string') {
    return DOCUMENT_ID.test(value) && Buffer.byteLength(value) <= 511 ? value : null
  }
  return null
}

/** Reads a dotted path as a plain value (for the primary key and `_geo`). */
export function readPath(document: JsonObject, path: string): unknown {
  if (path in document) return document[path]
  let current: unknown = document
  for (const part of path.split('.')) {
    if (current === null || typeof current !== 'object' || Array.isArray(current)) return undefined
    current = (current as JsonObject)[part]
  }
  return current
}

/** `_geo.lat`/`_geo.lng` may be numbers or numeric strings. */
export function geoCoordinate(value: unknown): number | null {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null
  if (typeof value === 'string' && value.trim() !== '') {
    const parsed = Number(value)
    return Number.isFinite(parsed) ? parsed : null
  }
  return null
}

/** Text the full-text index sees for a field: scalars joined, nested values included. */
export function searchableText(value: unknown): string {
  if (value === null || value === undefined) return ''
  if (Array.isArray(value)) return value.map(searchableText).filter(Boolean).join('. ')
  if (typeof value === 'object')
    return Object.values(value as JsonObject)
      .map(searchableText)
      .filter(Boolean)
      .join('. ')
  return String(value)
}

/** Keeps only the selected attributes (`*` keeps all), nested selections included. */
export function projectDocument(document: JsonObject, selectors: string[] | null): JsonObject {
  if (selectors === null || selectors.includes('*')) return { ...document }
  const projected: JsonObject = {}
  for (const [key, value] of Object.entries(document)) {
    if (selectors.some((selector) => selector === key || key.startsWith(`${selector}.`))) {
      projected[key] = value
      continue
    }
    const nested = selectors.filter((selector) => selector.startsWith(`${key}.`)).map((selector) => selector.slice(key.length + 1))
    if (nested.length === 0) continue
    if (Array.isArray(value)) {
      projected[key] = value
        .filter((element) => element !== null && typeof element === 'object' && !Array.isArray(element))
        .map((element) => projectDocument(element as JsonObject, nested))
    } else if (value !== null && typeof value === 'object') {
      projected[key] = projectDocument(value as JsonObject, nested)
    }
  }
  return projected
}
