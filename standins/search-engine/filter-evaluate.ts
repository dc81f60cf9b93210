// Evaluates a parsed filter to the set of matching documents, with the engine's semantics
// (milli search/facet/filter.rs): `=` matches normalised strings and equal numbers, `!=` is the
// complement of `=` (documents without the attribute included), comparisons cover numbers and
// byte-ordered strings, array attributes match if any element matches, and geo clauses need
// `_geo` to be filterable.

import { DocSet } from './doc-set'
import { EngineError, engineErrors } from './errors'
import type { FacetColumn, RangeBound } from './facet-index'
import { filterFields, messageAtToken, type FilterCondition, type FilterNode, type FilterToken } from './filter-parser'
import type { GeoIndex } from './geo'
import { filterFeatures, filterablePatterns, type IndexSettings } from './settings'

export interface FilterContext {
  indexUid: string
  settings: IndexSettings
  capacity: number
  all(): DocSet
  column(attribute: string): FacetColumn | undefined
  geo: GeoIndex
  /** Error code for this route: invalid_search_filter, invalid_document_filter… */
  errorCode: string
  /**
   * Sets already computed for single conditions since the index last changed. Searches repeat the
   * same clauses (a cone, an atmosphere), so each is worked out once per revision of the index.
   */
  conditionCache?: Map<string, DocSet>
}

const CONDITION_CACHE_LIMIT = 512

function conditionKey(field: FilterToken, condition: FilterCondition): string {
  const parts = [field.value, condition.kind]
  if ('value' in condition) parts.push(condition.value.value)
  if (condition.kind === 'between') parts.push(condition.from.value, condition.to.value)
  if ('word' in condition) parts.push(condition.word.value)
  return parts.join('\u0000')
}

/** A condition's documents, from the cache when this revision of the index has seen it before. */
function cachedCondition(context: FilterContext, field: FilterToken, condition: FilterCondition): DocSet {
  const cache = context.conditionCache
  if (!cache) return evaluateCondition(context, field, condition)
  const key = conditionKey(field, condition)
  let found = cache.get(key)
  if (!found) {
    found = evaluateCondition(context, field, condition)
    if (cache.size >= CONDITION_CACHE_LIMIT) cache.delete(cache.keys().next().value!)
    cache.set(key, found)
  }
  return found
}

const RUST_FLOAT = /^[+-]?(?:\d+\.?\d*(?:[eE][+-]?\d+)?|\.\d+(?:[eE][+-]?\d+)?|inf|infinity|nan)$/i

/** Rust's `f64::from_str` followed by a finiteness check; null when the token is not a number. */
export function finiteNumber(text: string): number | null {
  if (!RUST_FLOAT.test(text)) return null
  const value = Number(text)
  return Number.isFinite(value) ? value : null
}

function fail(context: FilterContext, token: FilterToken, diagnostic: string): never {
  throw new EngineError(400, context.errorCode, `Index \`${context.indexUid}\`: ${messageAtToken(token, diagnostic)}`)
}

function notFilterable(context: FilterContext, token: FilterToken, attribute: string): never {
  const patterns = filterablePatterns(context.settings)
  const available =
    patterns.length === 0
      ? ' This index does not have configured filterable attributes.'
      : ` Available filterable attribute patterns are: ${patterns.map((pattern) => `\`${pattern}\``).join(', ')}.`
  fail(context, token, `Attribute \`${attribute}\` is not filterable.${available}`)
}

/** Refuses a filter that reads an attribute outside filterableAttributes, before evaluating it. */
export function checkFilterable(context: FilterContext, node: FilterNode): void {
  rejectContains(context, node)
  for (const field of filterFields(node)) {
    const features = filterFeatures(context.settings, field.value)
    if (!features || !(features.equality || features.comparison)) notFilterable(context, field, field.value)
  }
}

function rejectContains(context: FilterContext, node: FilterNode): void {
  if (node.type === 'and' || node.type === 'or') node.children.forEach((child) => rejectContains(context, child))
  else if (node.type === 'not') rejectContains(context, node.child)
  else if (node.type === 'condition' && node.condition.kind === 'contains') {
    const message = messageAtToken(
      node.condition.keyword,
      'Using `CONTAINS` in a filter requires enabling the `contains filter` experimental feature. See https://github.com/orgs/meilisearch/discussions/763',
    )
    throw engineErrors.featureNotEnabled(message)
  }
}

function operatorAllowed(context: FilterContext, field: FilterToken, operator: string, comparison: boolean): void {
  const features = filterFeatures(context.settings, field.value)!
  if (comparison ? features.comparison : features.equality) return
  const allowed = [
    ...(features.equality ? ['=', '!=', 'IN'] : []),
    ...(features.comparison ? ['<', '>', '<=', '>=', 'TO'] : []),
    'IS EMPTY',
    'IS NULL',
    'EXISTS',
  ]
  const kind = comparison ? 'comparison' : 'equality'
  const message = `Filter operator \`${operator}\` is not allowed for the attribute \`${field.value}\`.\n  - Note: allowed operators: ${allowed.join(', ')}.\n  - Note: field \`${field.value}\` matched rule #${features.ruleIndex} in \`filterableAttributes\`\n  - Hint: enable ${kind} in rule #${features.ruleIndex} by modifying the features.filter object\n  - Hint: prepend another rule matching \`${field.value}\` with appropriate filter features before rule #${features.ruleIndex}`
  fail(context, field, message)
}

function geoCoordinateOf(context: FilterContext, token: FilterToken, kind: 'lat' | 'lng'): number {
  const value = finiteNumber(token.value)
  if (value === null) fail(context, token, 'Non finite floats are not supported')
  if (kind === 'lat' && !(value >= -90 && value <= 90)) {
    fail(context, token, `Bad latitude \`${value}\`. Latitude must be contained between -90 and 90 degrees. `)
  }
  if (kind === 'lng' && !(value >= -180 && value <= 180)) {
    fail(context, token, `Bad longitude \`${value}\`. Longitude must be contained between -180 and 180 degrees. `)
  }
  return value
}

function requireGeoFilterable(context: FilterContext, token: FilterToken): void {
  const features = filterFeatures(context.settings, '_geo')
  if (!features || !(features.equality || features.comparison)) notFilterable(context, token, '_geo')
}

function evaluateCondition(context: FilterContext, field: FilterToken, condition: FilterCondition): DocSet {
  const column = context.column(field.value)
  const empty = new DocSet(context.capacity)
  switch (condition.kind) {
    case 'exists':
      return column ? DocSet.of(context.capacity, column.exists) : empty
    case 'null':
      return column ? DocSet.of(context.capacity, column.nulls) : empty
    case 'empty':
      return column ? DocSet.of(context.capacity, column.empties) : empty
    case 'equal':
      operatorAllowed(context, field, '=', false)
      return column ? column.equalTo(context.capacity, condition.value.value, finiteNumber(condition.value.value)) : empty
    case 'notEqual': {
      operatorAllowed(context, field, '!=', false)
      const equal = column ? column.equalTo(context.capacity, condition.value.value, finiteNumber(condition.value.value)) : empty
      return context.all().andNot(equal)
    }
    case 'startsWith': {
      operatorAllowed(context, field, 'STARTS WITH', false)
      if (!column) return empty
      const prefix = condition.word.value.trim().normalize('NFKD').toLowerCase()
      const found = new DocSet(context.capacity)
      for (const [key, ids] of column.strings) if (key.startsWith(prefix)) for (const id of ids) found.add(id)
      return found
    }
    case 'contains':
      return empty
    default: {
      const operator = { greaterThan: '>', greaterThanOrEqual: '>=', lowerThan: '<', lowerThanOrEqual: '<=', between: 'TO' }[condition.kind]
      operatorAllowed(context, field, operator, true)
      if (!column) return empty
      return rangeOf(context, column, condition)
    }
  }
}

function rangeOf(context: FilterContext, column: FacetColumn, condition: FilterCondition): DocSet {
  const bound = <T>(value: T, inclusive: boolean): RangeBound<T> => ({ value, inclusive })
  if (condition.kind === 'between') {
    const from = finiteNumber(condition.from.value)
    const to = finiteNumber(condition.to.value)
    return column.inRange(context.capacity, from !== null && to !== null ? { low: bound(from, true), high: bound(to, true) } : null, {
      low: bound(condition.from.value, true),
      high: bound(condition.to.value, true),
    })
  }
  if (!('value' in condition)) return new DocSet(context.capacity)
  const text = condition.value.value
  const number = finiteNumber(text)
  const lower = condition.kind === 'greaterThan' || condition.kind === 'greaterThanOrEqual'
  const inclusive = condition.kind === 'greaterThanOrEqual' || condition.kind === 'lowerThanOrEqual'
  const numberRange =
    number === null ? null : lower ? { low: bound(number, inclusive), high: null } : { low: null, high: bound(number, inclusive) }
  const stringRange = lower ? { low: bound(text, inclusive), high: null } : { low: null, high: bound(text, inclusive) }
  return column.inRange(context.capacity, numberRange, stringRange)
}

/** The documents a checked filter selects. */
export function evaluateFilter(context: FilterContext, node: FilterNode): DocSet {
  switch (node.type) {
    case 'and': {
      let result = evaluateFilter(context, node.children[0])
      for (const child of node.children.slice(1)) {
        if (result.isEmpty()) break
        result = result.and(evaluateFilter(context, child))
      }
      return result
    }
    case 'or':
      return node.children.map((child) => evaluateFilter(context, child)).reduce((union, set) => union.or(set))
    case 'not':
      return context.all().andNot(evaluateFilter(context, node.child))
    case 'condition':
      return cachedCondition(context, node.field, node.condition)
    case 'in': {
      operatorAllowed(context, node.field, 'IN', false)
      const column = context.column(node.field.value)
      const found = new DocSet(context.capacity)
      if (!column) return found
      return node.values.reduce((union, value) => union.or(column.equalTo(context.capacity, value.value, finiteNumber(value.value))), found)
    }
    case 'geoRadius': {
      requireGeoFilterable(context, node.lat)
      const lat = geoCoordinateOf(context, node.lat, 'lat')
      const lng = geoCoordinateOf(context, node.lng, 'lng')
      const radius = finiteNumber(node.radius.value)
      if (radius === null) fail(context, node.radius, 'Non finite floats are not supported')
      return DocSet.of(context.capacity, context.geo.withinRadius(lat, lng, radius))
    }
    case 'geoBoundingBox': {
      requireGeoFilterable(context, node.topRight[0])
      const north = geoCoordinateOf(context, node.topRight[0], 'lat')
      const east = geoCoordinateOf(context, node.topRight[1], 'lng')
      const south = geoCoordinateOf(context, node.bottomLeft[0], 'lat')
      const west = geoCoordinateOf(context, node.bottomLeft[1], 'lng')
      if (north < south) {
        fail(context, node.bottomLeft[1], `The top latitude \`${north}\` is below the bottom latitude \`${south}\`.`)
      }
      return DocSet.of(context.capacity, context.geo.withinBox(north, east, south, west))
    }
  }
}
