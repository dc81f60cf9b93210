// Ordering candidates the way the engine's sort ranking rules do: `attribute:asc|desc` puts
// numbers before strings before documents without the attribute; `_geoPoint(lat, lng)` orders
// by haversine distance with unlocated documents last. Sort parameters are checked against
// sortableAttributes with the engine's messages before anything is sorted.

import type { EngineIndex, StoredDocument } from './engine-index'
import { normalizeFacet, patternCovers } from './document-fields'
import { EngineError, engineErrors } from './errors'
import { compareBytes } from './facet-index'
import { finiteNumber } from './filter-evaluate'
import { haversineMetres } from './geo'
import { compareStrings, isSortable } from './settings'

export type SortCriterion =
  { kind: 'field'; field: string; ascending: boolean } | { kind: 'geo'; lat: number; lng: number; ascending: boolean }

const RESERVED_SORT_NAMES = ['_geo', '_geoDistance', '_geoPoint', '_geoRadius', '_geoBoundingBox']
const GEO_SUGGESTION = 'Use the _geoPoint(latitude, longitude) built-in rule to sort on _geo field coordinates.'

/** milli `AscDesc::from_str` with the `SortError` messages. */
export function parseSortCriterion(text: string, code: string): SortCriterion {
  const fail = (message: string): never => {
    throw engineErrors.invalid(code, message)
  }
  const colon = text.lastIndexOf(':')
  const direction = colon === -1 ? '' : text.slice(colon + 1)
  if (direction !== 'asc' && direction !== 'desc') {
    fail(`Invalid syntax for the sort parameter: expected expression ending by \`:asc\` or \`:desc\`, found \`${text}\`.`)
  }
  const member = text.slice(0, colon)
  const ascending = direction === 'asc'
  const badGeoPoint = (): never =>
    fail(
      `Invalid syntax for the geo parameter: expected expression formated like \`_geoPoint(latitude, longitude)\` and ending by \`:asc\` or \`:desc\`, found \`${member}\`.`,
    )

  if (member.startsWith('_geoPoint(') && member.endsWith(')')) {
    const inner = member.slice('_geoPoint('.length, -1)
    const comma = inner.indexOf(',')
    if (comma === -1) badGeoPoint()
    const lat = finiteNumber(inner.slice(0, comma).trim())
    const lng = finiteNumber(inner.slice(comma + 1).trim())
    if (lat === null || lng === null) badGeoPoint()
    if (!(lat! >= -90 && lat! <= 90)) fail(`Bad latitude \`${lat}\`. Latitude must be contained between -90 and 90 degrees. `)
    if (!(lng! >= -180 && lng! <= 180)) fail(`Bad longitude \`${lng}\`. Longitude must be contained between -180 and 180 degrees. `)
    return { kind: 'geo', lat: lat!, lng: lng!, ascending }
  }
  const reserved =
    RESERVED_SORT_NAMES.includes(member) ||
    ['_geoRadius(', '_geoBoundingBox(', '_geo(', '_geoDistance('].some((prefix) => member.startsWith(prefix))
  if (reserved) {
    if (member.startsWith('_geoPoint')) badGeoPoint()
    if (member === '_geo') fail(`\`_geo\` is a reserved keyword and thus can't be used as a sort expression. ${GEO_SUGGESTION}`)
    if (member.startsWith('_geoRadius'))
      fail(`\`_geoRadius\` is a reserved keyword and thus can't be used as a sort expression. ${GEO_SUGGESTION}`)
    if (member.startsWith('_geoBoundingBox'))
      fail(`\`_geoBoundingBox\` is a reserved keyword and thus can't be used as a sort expression. ${GEO_SUGGESTION}`)
    fail(`\`${member}\` is a reserved keyword and thus can't be used as a sort expression.`)
  }
  return { kind: 'field', field: member, ascending }
}

/** Where a document falls when sorted on one attribute: numbers, then strings, then missing. */
interface DocumentSortKey {
  rank: 0 | 1 | 2
  minNumber: number
  maxNumber: number
  minText: string
  maxText: string
}

const sortKeyCache = new WeakMap<StoredDocument, Map<string, DocumentSortKey>>()

/** A document's sort key for an attribute; kept per stored version, which never changes. */
function documentSortKey(document: StoredDocument, field: string): DocumentSortKey {
  let keys = sortKeyCache.get(document)
  if (!keys) {
    keys = new Map()
    sortKeyCache.set(document, keys)
  }
  let key = keys.get(field)
  if (!key) {
    const values = document.flat.get(field)?.values ?? []
    const numbers = values.filter((value): value is number => typeof value === 'number')
    const texts = values
      .filter((value) => typeof value !== 'number')
      .map((value) => normalizeFacet(String(value)))
      .sort(compareBytes)
    key =
      numbers.length > 0
        ? { rank: 0, minNumber: Math.min(...numbers), maxNumber: Math.max(...numbers), minText: '', maxText: '' }
        : texts.length > 0
          ? { rank: 1, minNumber: 0, maxNumber: 0, minText: texts[0], maxText: texts[texts.length - 1] }
          : { rank: 2, minNumber: 0, maxNumber: 0, minText: '', maxText: '' }
    keys.set(field, key)
  }
  return key
}

/** Compares two candidates by their positions in the candidate list. */
export type Comparator = (a: number, b: number) => number

/** Ascending takes each document's smallest value, descending its largest, as the engine's facet walk does. */
export function attributeComparator(documents: StoredDocument[], field: string, ascending: boolean): Comparator {
  const ranks = new Uint8Array(documents.length)
  const numbers = new Float64Array(documents.length)
  const texts: string[] = new Array(documents.length)
  documents.forEach((document, position) => {
    const key = documentSortKey(document, field)
    ranks[position] = key.rank
    numbers[position] = ascending ? key.minNumber : key.maxNumber
    texts[position] = ascending ? key.minText : key.maxText
  })
  const direction = ascending ? 1 : -1
  return (a, b) => {
    if (ranks[a] !== ranks[b]) return ranks[a] - ranks[b]
    if (ranks[a] === 0) return (numbers[a] - numbers[b]) * direction
    return compareBytes(texts[a], texts[b]) * direction
  }
}

/** Documents without `_geo` come after every located one, in either direction. */
function geoComparator(index: EngineIndex, documents: StoredDocument[], lat: number, lng: number, ascending: boolean): Comparator {
  const distances = new Float64Array(documents.length)
  documents.forEach((document, position) => {
    const point = index.geo.get(document.internalId)
    distances[position] = point ? haversineMetres(lat, lng, point.lat, point.lng) : Number.NaN
  })
  return (a, b) => {
    const left = distances[a]
    const right = distances[b]
    if (Number.isNaN(left) || Number.isNaN(right)) return Number.isNaN(left) ? (Number.isNaN(right) ? 0 : 1) : -1
    return ascending ? left - right : right - left
  }
}

/** Checks sort criteria against the settings (raising the engine's errors) before any sorting. */
export function checkSort(index: EngineIndex, sort: string[], code: string, searchRoute: boolean): SortCriterion[] {
  const criteria = sort.map((text) => parseSortCriterion(text, code))
  if (criteria.length === 0) return criteria
  if (searchRoute && !index.settings.rankingRules.includes('sort')) {
    throw engineErrors.invalid(
      code,
      'You must specify where `sort` is listed in the rankingRules setting to use the sort parameter at search time.',
    )
  }
  for (const criterion of criteria) {
    const field = criterion.kind === 'geo' ? '_geo' : criterion.field
    const allowed = criterion.kind === 'geo' ? index.settings.sortableAttributes.includes('_geo') : isSortable(index.settings, field)
    if (!allowed) throw notSortable(index, field, code)
  }
  return criteria
}

export function criterionComparator(index: EngineIndex, documents: StoredDocument[], criterion: SortCriterion): Comparator {
  return criterion.kind === 'geo'
    ? geoComparator(index, documents, criterion.lat, criterion.lng, criterion.ascending)
    : attributeComparator(documents, criterion.field, criterion.ascending)
}

/** Orders documents by sort criteria, ties in internal order (for the documents route). */
export function sortDocuments(index: EngineIndex, documents: StoredDocument[], sort: string[], code: string): StoredDocument[] {
  const comparators = checkSort(index, sort, code, false).map((criterion) => criterionComparator(index, documents, criterion))
  if (comparators.length === 0) return documents
  return orderPositions(documents, comparators, documents.length).map((position) => documents[position])
}

/**
 * Positions of the `wanted` best candidates in order. A bounded heap keeps this at
 * O(n log wanted) when only a page is needed; ties fall back to internal document order.
 */
export function orderPositions(documents: StoredDocument[], comparators: Comparator[], wanted: number): number[] {
  const compare: Comparator = (a, b) => {
    for (const comparator of comparators) {
      const order = comparator(a, b)
      if (order !== 0) return order
    }
    return documents[a].internalId - documents[b].internalId
  }
  const count = documents.length
  if (wanted >= count / 4) {
    const all = Array.from({ length: count }, (_, position) => position)
    return all.sort(compare).slice(0, wanted)
  }
  const heap: number[] = []
  const siftDown = (from: number) => {
    let parent = from
    for (;;) {
      const left = parent * 2 + 1
      const right = left + 1
      let worst = parent
      if (left < heap.length && compare(heap[left], heap[worst]) > 0) worst = left
      if (right < heap.length && compare(heap[right], heap[worst]) > 0) worst = right
      if (worst === parent) return
      ;[heap[parent], heap[worst]] = [heap[worst], heap[parent]]
      parent = worst
    }
  }
  for (let position = 0; position < count; position++) {
    if (heap.length < wanted) {
      heap.push(position)
      let child = heap.length - 1
      while (child > 0) {
        const parent = (child - 1) >>> 1
        if (compare(heap[child], heap[parent]) <= 0) break
        ;[heap[child], heap[parent]] = [heap[parent], heap[child]]
        child = parent
      }
    } else if (wanted > 0 && compare(position, heap[0]) < 0) {
      heap[0] = position
      siftDown(0)
    }
  }
  return heap.sort(compare)
}

function notSortable(index: EngineIndex, field: string, code: string): EngineError {
  const displayed = index.settings.displayedAttributes
  const sortable = [...new Set(index.settings.sortableAttributes)].sort(compareStrings)
  const visible = displayed.includes('*') ? sortable : sortable.filter((name) => displayed.some((pattern) => patternCovers(pattern, name)))
  const hidden = visible.length < sortable.length
  const available =
    sortable.length === 0
      ? 'This index does not have configured sortable attributes.'
      : `Available sortable attributes are: \`${visible.join(', ')}${hidden ? ', <..hidden-attributes>' : ''}\`.`
  return engineErrors.invalid(code, `Index \`${index.uid}\`: Attribute \`${field}\` is not sortable. ${available}`)
}
