// Index settings: the engine's defaults, validation of an update body with the engine's error
// codes, and the PATCH rule (a key set to null goes back to its default).

import { engineErrors } from './errors'
import { patternCovers } from './document-fields'

export interface GranularFilterableAttribute {
  attributePatterns: string[]
  features: { facetSearch: boolean; filter: { equality: boolean; comparison: boolean } }
}

export interface TypoToleranceSettings {
  enabled: boolean
  minWordSizeForTypos: { oneTypo: number; twoTypos: number }
  disableOnWords: string[]
  disableOnAttributes: string[]
  disableOnNumbers: boolean
}

export interface IndexSettings {
  displayedAttributes: string[]
  searchableAttributes: string[]
  filterableAttributes: Array<string | GranularFilterableAttribute>
  sortableAttributes: string[]
  rankingRules: string[]
  stopWords: string[]
  nonSeparatorTokens: string[]
  separatorTokens: string[]
  dictionary: string[]
  synonyms: Record<string, string[]>
  distinctAttribute: string | null
  proximityPrecision: 'byWord' | 'byAttribute'
  typoTolerance: TypoToleranceSettings
  faceting: { maxValuesPerFacet: number; sortFacetValuesBy: Record<string, 'alpha' | 'count'> }
  pagination: { maxTotalHits: number }
  embedders: Record<string, unknown>
  searchCutoffMs: number | null
  localizedAttributes: unknown[] | null
  facetSearch: boolean
  prefixSearch: 'indexingTime' | 'disabled'
}

export const RELEVANCE_RULES = ['words', 'typo', 'proximity', 'attribute', 'exactness'] as const

export function defaultSettings(): IndexSettings {
  return {
    displayedAttributes: ['*'],
    searchableAttributes: ['*'],
    filterableAttributes: [],
    sortableAttributes: [],
    rankingRules: ['words', 'typo', 'proximity', 'attribute', 'sort', 'exactness'],
    stopWords: [],
    nonSeparatorTokens: [],
    separatorTokens: [],
    dictionary: [],
    synonyms: {},
    distinctAttribute: null,
    proximityPrecision: 'byWord',
    typoTolerance: {
      enabled: true,
      minWordSizeForTypos: { oneTypo: 5, twoTypos: 9 },
      disableOnWords: [],
      disableOnAttributes: [],
      disableOnNumbers: false,
    },
    faceting: { maxValuesPerFacet: 100, sortFacetValuesBy: { '*': 'alpha' } },
    pagination: { maxTotalHits: 1000 },
    embedders: {},
    searchCutoffMs: null,
    localizedAttributes: null,
    facetSearch: true,
    prefixSearch: 'indexingTime',
  }
}

export const SETTING_NAMES = Object.keys(defaultSettings()) as Array<keyof IndexSettings>

/** Sub-route names (`/settings/filterable-attributes`) to setting keys. */
export const SETTING_ROUTES: Record<string, keyof IndexSettings> = Object.fromEntries(
  SETTING_NAMES.map((name) => [name.replace(/[A-Z]/g, (letter) => `-${letter.toLowerCase()}`), name]),
)

const errorCodeFor = (name: string): string => `invalid_settings_${name.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`)}`

/** deserr's description of a JSON value in type errors. */
export function describeJson(value: unknown): string {
  if (value === null) return 'null'
  if (Array.isArray(value)) return `an array: \`${JSON.stringify(value)}\``
  if (typeof value === 'string') return `a string: \`${JSON.stringify(value)}\``
  if (typeof value === 'boolean') return `a boolean: \`${value}\``
  if (typeof value === 'number') {
    if (Number.isInteger(value)) return value < 0 ? `a negative integer: \`${value}\`` : `a positive integer: \`${value}\``
    return `a number: \`${value}\``
  }
  return `an object: \`${JSON.stringify(value)}\``
}

function typeError(name: string, path: string, expected: string, found: unknown): Error {
  return engineErrors.invalid(
    errorCodeFor(name),
    `Invalid value type at \`${path}\`: expected ${expected}, but found ${describeJson(found)}`,
  )
}

function stringList(name: string, value: unknown): string[] {
  if (!Array.isArray(value)) throw typeError(name, `.${name}`, 'an array', value)
  value.forEach((member, index) => {
    if (typeof member !== 'string') throw typeError(name, `.${name}[${index}]`, 'a string', member)
  })
  return value as string[]
}

const CUSTOM_RANKING_RULE = /^(.+):(asc|desc)$/

function rankingRules(value: unknown): string[] {
  const rules = stringList('rankingRules', value)
  rules.forEach((rule, index) => {
    const known = rule === 'sort' || (RELEVANCE_RULES as readonly string[]).includes(rule) || CUSTOM_RANKING_RULE.test(rule)
    if (!known) {
      throw engineErrors.invalid(
        'invalid_settings_ranking_rules',
        `Invalid value at \`.rankingRules[${index}]\`: \`${rule}\` ranking rule is invalid. Valid ranking rules are words, typo, sort, proximity, attribute, exactness and custom ranking rules.`,
      )
    }
  })
  return rules
}

function filterableAttributes(value: unknown): Array<string | GranularFilterableAttribute> {
  if (!Array.isArray(value)) throw typeError('filterableAttributes', '.filterableAttributes', 'an array', value)
  return value.map((member, index) => {
    if (typeof member === 'string') return member
    const path = `.filterableAttributes[${index}]`
    if (member === null || typeof member !== 'object' || Array.isArray(member)) {
      throw typeError('filterableAttributes', path, 'a string or an object', member)
    }
    const rule = member as Partial<GranularFilterableAttribute>
    const patterns = stringList('filterableAttributes', rule.attributePatterns ?? [])
    const filter = rule.features?.filter
    return {
      attributePatterns: patterns,
      features: {
        facetSearch: rule.features?.facetSearch ?? false,
        filter: { equality: filter?.equality ?? true, comparison: filter?.comparison ?? false },
      },
    }
  })
}

function oneOf<T extends string>(name: string, value: unknown, allowed: readonly T[]): T {
  if (!allowed.includes(value as T)) {
    throw engineErrors.invalid(
      errorCodeFor(name),
      `Unknown value \`${String(value)}\` at \`.${name}\`: expected one of ${allowed.map((option) => `\`${option}\``).join(', ')}`,
    )
  }
  return value as T
}

function wholeNumber(name: string, path: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) throw typeError(name, path, 'a positive integer', value)
  return value
}

function objectValue(name: string, value: unknown): Record<string, unknown> {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) throw typeError(name, `.${name}`, 'an object', value)
  return value as Record<string, unknown>
}

/** Applies an update body to the current settings; throws the engine's 400 on a bad body. */
export function applySettingsUpdate(current: IndexSettings, update: unknown): IndexSettings {
  if (update === null || typeof update !== 'object' || Array.isArray(update)) {
    throw engineErrors.badRequest(`Invalid value type: expected an object, but found ${describeJson(update)}`)
  }
  const defaults = defaultSettings()
  const next: IndexSettings = structuredClone(current)
  for (const [name, value] of Object.entries(update as Record<string, unknown>)) {
    if (!(SETTING_NAMES as string[]).includes(name)) {
      throw engineErrors.badRequest(`Unknown field \`${name}\`: expected one of ${SETTING_NAMES.map((known) => `\`${known}\``).join(', ')}`)
    }
    const key = name as keyof IndexSettings
    if (value === null) {
      ;(next as unknown as Record<string, unknown>)[key] = structuredClone(defaults[key])
      continue
    }
    switch (key) {
      case 'displayedAttributes':
      case 'searchableAttributes':
        next[key] = stringList(key, value)
        break
      // The engine keeps these as ordered sets, so it answers them sorted and without repeats.
      case 'sortableAttributes':
      case 'stopWords':
      case 'nonSeparatorTokens':
      case 'separatorTokens':
      case 'dictionary':
        next[key] = [...new Set(stringList(key, value))].sort(compareStrings)
        break
      case 'filterableAttributes':
        next.filterableAttributes = filterableAttributes(value)
        break
      case 'rankingRules':
        next.rankingRules = rankingRules(value)
        break
      case 'synonyms': {
        const synonyms = objectValue(key, value)
        for (const list of Object.values(synonyms)) stringList(key, list)
        next.synonyms = synonyms as Record<string, string[]>
        break
      }
      case 'distinctAttribute':
        if (typeof value !== 'string') throw typeError(key, `.${key}`, 'a string', value)
        next.distinctAttribute = value
        break
      case 'proximityPrecision':
        next.proximityPrecision = oneOf(key, value, ['byWord', 'byAttribute'] as const)
        break
      case 'typoTolerance': {
        const typo = objectValue(key, value)
        const merged = next.typoTolerance
        if ('enabled' in typo) merged.enabled = typo.enabled === null ? defaults.typoTolerance.enabled : Boolean(typo.enabled)
        if ('disableOnWords' in typo) merged.disableOnWords = typo.disableOnWords === null ? [] : stringList(key, typo.disableOnWords)
        if ('disableOnAttributes' in typo)
          merged.disableOnAttributes = typo.disableOnAttributes === null ? [] : stringList(key, typo.disableOnAttributes)
        if ('disableOnNumbers' in typo) merged.disableOnNumbers = Boolean(typo.disableOnNumbers)
        if (typo.minWordSizeForTypos && typeof typo.minWordSizeForTypos === 'object') {
          const sizes = typo.minWordSizeForTypos as Record<string, unknown>
          const size = (field: 'oneTypo' | 'twoTypos'): number => {
            if (!(field in sizes)) return merged.minWordSizeForTypos[field]
            if (sizes[field] === null) return defaults.typoTolerance.minWordSizeForTypos[field]
            return wholeNumber(key, `.typoTolerance.minWordSizeForTypos.${field}`, sizes[field])
          }
          const oneTypo = size('oneTypo')
          const twoTypos = size('twoTypos')
          if (oneTypo > 255 || twoTypos > 255 || twoTypos < oneTypo) {
            throw engineErrors.invalid(
              errorCodeFor(key),
              `\`minWordSizeForTypos\` setting is invalid. \`oneTypo\` and \`twoTypos\` fields should be between \`0\` and \`255\`, and \`twoTypos\` should be greater or equals to \`oneTypo\` but found \`oneTypo: ${oneTypo}\` and twoTypos: ${twoTypos}\`.`,
            )
          }
          merged.minWordSizeForTypos = { oneTypo, twoTypos }
        }
        break
      }
      case 'faceting': {
        const faceting = objectValue(key, value)
        if ('maxValuesPerFacet' in faceting) {
          next.faceting.maxValuesPerFacet =
            faceting.maxValuesPerFacet === null ? 100 : wholeNumber(key, '.faceting.maxValuesPerFacet', faceting.maxValuesPerFacet)
        }
        if ('sortFacetValuesBy' in faceting) {
          next.faceting.sortFacetValuesBy =
            faceting.sortFacetValuesBy === null
              ? { '*': 'alpha' }
              : { '*': 'alpha', ...(objectValue(key, faceting.sortFacetValuesBy) as Record<string, 'alpha' | 'count'>) }
        }
        break
      }
      case 'pagination': {
        const pagination = objectValue(key, value)
        if ('maxTotalHits' in pagination) {
          next.pagination.maxTotalHits =
            pagination.maxTotalHits === null ? 1000 : wholeNumber(key, '.pagination.maxTotalHits', pagination.maxTotalHits)
        }
        break
      }
      case 'embedders':
        next.embedders = objectValue(key, value)
        break
      case 'searchCutoffMs':
        next.searchCutoffMs = wholeNumber(key, '.searchCutoffMs', value)
        break
      case 'localizedAttributes':
        if (!Array.isArray(value)) throw typeError(key, `.${key}`, 'an array', value)
        next.localizedAttributes = value
        break
      case 'facetSearch':
        if (typeof value !== 'boolean') throw typeError(key, `.${key}`, 'a boolean', value)
        next.facetSearch = value
        break
      case 'prefixSearch':
        next.prefixSearch = oneOf(key, value, ['indexingTime', 'disabled'] as const)
        break
    }
  }
  return next
}

/** Flat list of the filterable patterns, as the engine lists them in error messages (sorted). */
export function filterablePatterns(settings: IndexSettings): string[] {
  const patterns = settings.filterableAttributes.flatMap((rule) => (typeof rule === 'string' ? [rule] : rule.attributePatterns))
  return [...new Set(patterns)].sort(compareStrings)
}

/** The first rule covering an attribute decides what filtering it allows, as in the engine. */
export function filterFeatures(
  settings: IndexSettings,
  attribute: string,
): { equality: boolean; comparison: boolean; ruleIndex: number } | null {
  for (const [ruleIndex, rule] of settings.filterableAttributes.entries()) {
    if (typeof rule === 'string') {
      if (patternCovers(rule, attribute)) return { equality: true, comparison: true, ruleIndex }
    } else if (rule.attributePatterns.some((pattern) => patternCovers(pattern, attribute))) {
      return { ...rule.features.filter, ruleIndex }
    }
  }
  return null
}

export function isFilterable(settings: IndexSettings, attribute: string): boolean {
  const features = filterFeatures(settings, attribute)
  return features !== null && (features.equality || features.comparison)
}

export function isSortable(settings: IndexSettings, attribute: string): boolean {
  return settings.sortableAttributes.some((pattern) => patternCovers(pattern, attribute))
}

/** Rust's default string order (byte order), which the engine's sorted sets use. */
export function compareStrings(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}
