// Per-attribute facet columns for filterable attributes: which documents hold each normalised
// string and each number, and which have the attribute at all, as null, or as an empty value.
// Ranges read value-sorted typed arrays, rebuilt lazily after a change, so a range costs a binary
// search plus one bit per matching document.

import { DocSet } from './doc-set'
import { facetString, normalizeFacet, type FieldValues } from './document-fields'

function addTo<K>(map: Map<K, Set<number>>, key: K, id: number): void {
  let ids = map.get(key)
  if (!ids) {
    ids = new Set()
    map.set(key, ids)
  }
  ids.add(id)
}

function removeFrom<K>(map: Map<K, Set<number>>, key: K, id: number): void {
  const ids = map.get(key)
  if (!ids) return
  ids.delete(id)
  if (ids.size === 0) map.delete(key)
}

/** Bounds of a range: the value and whether it is included. */
export interface RangeBound<T> {
  value: T
  inclusive: boolean
}

interface SortedNumbers {
  values: Float64Array
  ids: Int32Array
}

interface SortedStrings {
  values: string[]
  ids: Int32Array
}

/** Byte-wise order of UTF-8 strings, the order LMDB keys sort in. */
export function compareBytes(a: string, b: string): number {
  if (a === b) return 0
  // UTF-16 order equals UTF-8 byte order below the surrogate range, which covers nearly all text.
  if (!BEYOND_SURROGATES.test(a) && !BEYOND_SURROGATES.test(b)) return a < b ? -1 : 1
  return Buffer.compare(Buffer.from(a), Buffer.from(b))
}

const BEYOND_SURROGATES = /[\uD800-\uFFFF]/

/**
 * Binary search for where a bound cuts a sorted list: for a lower bound the first position
 * inside the range, for an upper bound the first position past it.
 */
function cutPosition<T>(values: ArrayLike<T>, bound: RangeBound<T>, side: 'lower' | 'upper', compare: (a: T, b: T) => number): number {
  const inside = side === 'lower' ? !bound.inclusive : bound.inclusive
  let low = 0
  let high = values.length
  while (low < high) {
    const middle = (low + high) >>> 1
    const order = compare(values[middle], bound.value)
    if (order < 0 || (order === 0 && inside)) low = middle + 1
    else high = middle
  }
  return low
}

const compareNumbers = (a: number, b: number): number => a - b

export class FacetColumn {
  readonly strings = new Map<string, Set<number>>()
  readonly numbers = new Map<number, Set<number>>()
  readonly exists = new Set<number>()
  readonly nulls = new Set<number>()
  readonly empties = new Set<number>()
  /** The first spelling seen for each normalised string, which facet counts display. */
  private readonly originals = new Map<string, string>()
  private sortedNumbers: SortedNumbers | null = null
  private sortedStrings: SortedStrings | null = null
  /** Each document's values, so counts over a few candidates need not walk every value. */
  private readonly byDocument = new Map<number, { numbers: number[]; strings: string[] }>()

  add(id: number, field: FieldValues): void {
    this.exists.add(id)
    const own = { numbers: [] as number[], strings: [] as string[] }
    this.byDocument.set(id, own)
    if (field.isNull) this.nulls.add(id)
    if (field.isEmpty) this.empties.add(id)
    for (const value of field.values) {
      if (typeof value === 'number') {
        addTo(this.numbers, value, id)
        own.numbers.push(value)
        this.sortedNumbers = null
      } else {
        const original = facetString(value)!
        const key = normalizeFacet(original)
        if (!this.originals.has(key)) this.originals.set(key, original)
        addTo(this.strings, key, id)
        own.strings.push(key)
        this.sortedStrings = null
      }
    }
  }

  remove(id: number, field: FieldValues): void {
    this.exists.delete(id)
    this.byDocument.delete(id)
    this.nulls.delete(id)
    this.empties.delete(id)
    for (const value of field.values) {
      if (typeof value === 'number') {
        removeFrom(this.numbers, value, id)
        this.sortedNumbers = null
      } else {
        const key = normalizeFacet(facetString(value)!)
        removeFrom(this.strings, key, id)
        if (!this.strings.has(key)) this.originals.delete(key)
        this.sortedStrings = null
      }
    }
  }

  isEmpty(): boolean {
    return this.exists.size === 0
  }

  private numbersByValue(): SortedNumbers {
    if (!this.sortedNumbers) {
      const keys = [...this.numbers.keys()].sort(compareNumbers)
      const total = keys.reduce((sum, key) => sum + this.numbers.get(key)!.size, 0)
      const values = new Float64Array(total)
      const ids = new Int32Array(total)
      let position = 0
      for (const key of keys) {
        for (const id of this.numbers.get(key)!) {
          values[position] = key
          ids[position++] = id
        }
      }
      this.sortedNumbers = { values, ids }
    }
    return this.sortedNumbers
  }

  private stringsByValue(): SortedStrings {
    if (!this.sortedStrings) {
      const keys = [...this.strings.keys()].sort(compareBytes)
      const values: string[] = []
      const ids: number[] = []
      for (const key of keys) {
        for (const id of this.strings.get(key)!) {
          values.push(key)
          ids.push(id)
        }
      }
      this.sortedStrings = { values, ids: Int32Array.from(ids) }
    }
    return this.sortedStrings
  }

  equalTo(capacity: number, text: string, number: number | null): DocSet {
    const found = new DocSet(capacity)
    for (const id of this.strings.get(normalizeFacet(text)) ?? []) found.add(id)
    if (number !== null) for (const id of this.numbers.get(number) ?? []) found.add(id)
    return found
  }

  /** Numbers between the bounds (numeric order) and strings between them (byte order), as milli does. */
  inRange(
    capacity: number,
    numberRange: { low: RangeBound<number> | null; high: RangeBound<number> | null } | null,
    stringRange: { low: RangeBound<string> | null; high: RangeBound<string> | null },
  ): DocSet {
    const found = new DocSet(capacity)
    if (numberRange && this.numbers.size > 0) {
      const { values, ids } = this.numbersByValue()
      const start = numberRange.low ? cutPosition(values, numberRange.low, 'lower', compareNumbers) : 0
      const end = numberRange.high ? cutPosition(values, numberRange.high, 'upper', compareNumbers) : values.length
      for (let i = start; i < end; i++) found.add(ids[i])
    }
    if (this.strings.size > 0) {
      const { values, ids } = this.stringsByValue()
      const start = stringRange.low ? cutPosition(values, stringRange.low, 'lower', compareBytes) : 0
      const end = stringRange.high ? cutPosition(values, stringRange.high, 'upper', compareBytes) : values.length
      for (let i = start; i < end; i++) found.add(ids[i])
    }
    return found
  }

  /**
   * Facet counts over the candidates: numbers ascending, then strings in byte order, each under
   * the spelling the engine shows, plus the numeric min and max when there are numbers.
   */
  distribution(candidates: DocSet): { counts: Array<[string, number]>; min: number; max: number } {
    if (candidates.toArray().length * 8 < this.exists.size) return this.distributionOfFew(candidates)
    const counts: Array<[string, number]> = []
    let min = Infinity
    let max = -Infinity
    const { values, ids } = this.numbersByValue()
    let previous: number | null = null
    for (let i = 0; i < values.length; i++) {
      if (!candidates.has(ids[i])) continue
      const value = values[i]
      if (value < min) min = value
      if (value > max) max = value
      if (value === previous) counts[counts.length - 1][1]++
      else counts.push([String(value), 1])
      previous = value
    }
    for (const key of [...this.strings.keys()].sort(compareBytes)) {
      let count = 0
      for (const id of this.strings.get(key)!) if (candidates.has(id)) count++
      if (count > 0) counts.push([this.originals.get(key)!, count])
    }
    return { counts, min, max }
  }

  /** The same counts, reached from the candidates' own values: cheaper when they are few. */
  private distributionOfFew(candidates: DocSet): { counts: Array<[string, number]>; min: number; max: number } {
    const numbers = new Map<number, number>()
    const strings = new Map<string, number>()
    for (const id of candidates.toArray()) {
      const own = this.byDocument.get(id)
      if (!own) continue
      // A document counts once per distinct value, as in the walk over all values; most have one.
      const nums = own.numbers.length > 1 ? [...new Set(own.numbers)] : own.numbers
      for (let i = 0; i < nums.length; i++) numbers.set(nums[i], (numbers.get(nums[i]) ?? 0) + 1)
      const keys = own.strings.length > 1 ? [...new Set(own.strings)] : own.strings
      for (let i = 0; i < keys.length; i++) strings.set(keys[i], (strings.get(keys[i]) ?? 0) + 1)
    }
    const counts: Array<[string, number]> = [...numbers].sort((a, b) => a[0] - b[0]).map(([value, n]) => [String(value), n])
    for (const key of [...strings.keys()].sort(compareBytes)) counts.push([this.originals.get(key)!, strings.get(key)!])
    const values = [...numbers.keys()]
    return { counts, min: values.length ? Math.min(...values) : Infinity, max: values.length ? Math.max(...values) : -Infinity }
  }
}
