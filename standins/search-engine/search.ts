// POST/GET /indexes/:uid/search: reads the request the way the engine does (same defaults, same
// validation codes), selects candidates from the filter and MiniSearch, orders them by the
// index's ranking rules, and answers in the engine's response shape.

import { randomUUID } from 'node:crypto'

import { DocSet } from './doc-set'
import { normalizeFacet, patternCovers, projectDocument, readPath, type JsonObject } from './document-fields'
import type { EngineIndex, StoredDocument } from './engine-index'
import { engineErrors, type EngineError } from './errors'
import { checkFilterable, evaluateFilter, finiteNumber } from './filter-evaluate'
import { FilterSyntaxError, parseFilter } from './filter-parser'
import { haversineMetres } from './geo'
import { attributeComparator, checkSort, criterionComparator, orderPositions, type Comparator } from './ranking'
import { compareStrings, describeJson, filterablePatterns, isFilterable, RELEVANCE_RULES } from './settings'
import { parseQuery } from './text-index'

export interface SearchRequest {
  q: string | null
  offset: number
  limit: number
  page: number | null
  hitsPerPage: number | null
  filter: unknown
  sort: string[] | null
  facets: string[] | null
  attributesToRetrieve: string[] | null
  attributesToSearchOn: string[] | null
  matchingStrategy: 'last' | 'all' | 'frequency'
  distinct: string | null
}

const SEARCH_FIELDS = [
  'q',
  'vector',
  'offset',
  'limit',
  'page',
  'hitsPerPage',
  'attributesToRetrieve',
  'retrieveVectors',
  'attributesToCrop',
  'cropLength',
  'attributesToHighlight',
  'showMatchesPosition',
  'showRankingScore',
  'showRankingScoreDetails',
  'showPerformanceDetails',
  'filter',
  'sort',
  'distinct',
  'facets',
  'highlightPreTag',
  'highlightPostTag',
  'cropMarker',
  'matchingStrategy',
  'attributesToSearchOn',
  'rankingScoreThreshold',
  'locales',
  'hybrid',
  'media',
  'personalize',
  'useNetwork',
]

const searchCode = (field: string): string => `invalid_search_${field.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`)}`

function typeError(field: string, expected: string, found: unknown): EngineError {
  return engineErrors.invalid(
    searchCode(field),
    `Invalid value type at \`.${field}\`: expected ${expected}, but found ${describeJson(found)}`,
  )
}

function wholeNumber(body: Record<string, unknown>, field: string): number | null {
  const value = body[field]
  if (value === undefined || value === null) return null
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) throw typeError(field, 'a positive integer', value)
  return value
}

function stringList(body: Record<string, unknown>, field: string): string[] | null {
  const value = body[field]
  if (value === undefined || value === null) return null
  if (!Array.isArray(value)) throw typeError(field, 'an array', value)
  value.forEach((member, index) => {
    if (typeof member !== 'string') {
      throw engineErrors.invalid(
        searchCode(field),
        `Invalid value type at \`.${field}[${index}]\`: expected a string, but found ${describeJson(member)}`,
      )
    }
  })
  return value as string[]
}

/** Validates a POST body. */
export function readSearchBody(body: unknown): SearchRequest {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw engineErrors.badRequest(`Invalid value type: expected an object, but found ${describeJson(body)}`)
  }
  const fields = body as Record<string, unknown>
  for (const key of Object.keys(fields)) {
    if (!SEARCH_FIELDS.includes(key)) {
      throw engineErrors.badRequest(`Unknown field \`${key}\`: expected one of ${SEARCH_FIELDS.map((name) => `\`${name}\``).join(', ')}`)
    }
  }
  if (fields.q !== undefined && fields.q !== null && typeof fields.q !== 'string') throw typeError('q', 'a string', fields.q)
  const strategy = fields.matchingStrategy ?? 'last'
  if (strategy !== 'last' && strategy !== 'all' && strategy !== 'frequency') {
    throw engineErrors.invalid(
      'invalid_search_matching_strategy',
      `Unknown value \`${String(strategy)}\` at \`.matchingStrategy\`: expected one of \`last\`, \`all\`, \`frequency\``,
    )
  }
  if (fields.distinct !== undefined && fields.distinct !== null && typeof fields.distinct !== 'string') {
    throw typeError('distinct', 'a string', fields.distinct)
  }
  return {
    q: (fields.q as string | null | undefined) ?? null,
    offset: wholeNumber(fields, 'offset') ?? 0,
    limit: wholeNumber(fields, 'limit') ?? 20,
    page: wholeNumber(fields, 'page'),
    hitsPerPage: wholeNumber(fields, 'hitsPerPage'),
    filter: fields.filter ?? null,
    sort: stringList(fields, 'sort'),
    facets: stringList(fields, 'facets'),
    attributesToRetrieve: stringList(fields, 'attributesToRetrieve'),
    attributesToSearchOn: stringList(fields, 'attributesToSearchOn'),
    matchingStrategy: strategy,
    distinct: (fields.distinct as string | null | undefined) ?? null,
  }
}

/** `_geoPoint(1, 2):asc` contains a comma, so a comma-split sort list is glued back together. */
function splitSortParameter(text: string): string[] {
  const parts: string[] = []
  for (const piece of text.split(',')) {
    const last = parts[parts.length - 1]
    if (last !== undefined && last.includes('_geoPoint(') && !last.includes(')')) parts[parts.length - 1] = `${last},${piece}`
    else parts.push(piece)
  }
  return parts.map((part) => part.trim())
}

/** Translates GET query parameters into the POST body the engine would build from them. */
export function readSearchQuery(params: URLSearchParams): SearchRequest {
  const body: Record<string, unknown> = {}
  const list = (text: string): string[] =>
    text
      .split(',')
      .map((part) => part.trim())
      .filter(Boolean)
  for (const [key, text] of params) {
    switch (key) {
      case 'offset':
      case 'limit':
      case 'page':
      case 'hitsPerPage': {
        if (!/^\d+$/.test(text)) {
          throw engineErrors.invalid(
            searchCode(key),
            `Invalid value in parameter \`${key}\`: could not parse \`${text}\` as a positive integer`,
          )
        }
        body[key] = Number(text)
        break
      }
      case 'sort':
        body.sort = splitSortParameter(text)
        break
      case 'facets':
      case 'attributesToRetrieve':
      case 'attributesToSearchOn':
      case 'attributesToCrop':
      case 'attributesToHighlight':
        body[key] = list(text)
        break
      case 'filter':
        try {
          body.filter = JSON.parse(text)
        } catch {
          body.filter = text
        }
        break
      case 'showMatchesPosition':
      case 'showRankingScore':
      case 'showRankingScoreDetails':
      case 'showPerformanceDetails':
      case 'retrieveVectors':
        body[key] = text === 'true'
        break
      case 'hybridEmbedder':
      case 'hybridSemanticRatio':
        break
      default:
        body[key] = text
    }
  }
  return readSearchBody(body)
}

/** Parses, checks and evaluates a filter; null when there is no filter. */
export function filterDocuments(index: EngineIndex, filter: unknown, code: string): DocSet | null {
  let node
  try {
    node = parseFilter(filter)
  } catch (error) {
    if (error instanceof FilterSyntaxError) throw engineErrors.invalid(code, error.message)
    throw error
  }
  if (!node) return null
  const context = index.filterContext(code)
  checkFilterable(context, node)
  return evaluateFilter(context, node)
}

function facetNames(index: EngineIndex, requested: string[]): string[] {
  if (requested.includes('*')) {
    return index.facetedPaths().filter((path) => isFilterable(index.settings, path) && path !== '_geo' && !path.startsWith('_geo.'))
  }
  const invalid = [...new Set(requested.filter((name) => !isFilterable(index.settings, name)))].sort(compareStrings)
  if (invalid.length > 0) {
    const patterns = filterablePatterns(index.settings)
    const available =
      patterns.length === 0
        ? 'This index does not have configured filterable attributes.'
        : `Available filterable attributes patterns are: \`${patterns.join(', ')}\`.`
    const message =
      invalid.length === 1
        ? `Invalid facet distribution: Attribute \`${invalid[0]}\` is not filterable. ${available}`
        : `Invalid facet distribution: Attributes \`${invalid.join(', ')}\` are not filterable. ${available}`
    throw engineErrors.invalid('invalid_search_facets', message)
  }
  return requested
}

function facetOrder(index: EngineIndex, facet: string): 'alpha' | 'count' {
  const orders = index.settings.faceting.sortFacetValuesBy
  return orders[facet] ?? orders['*'] ?? 'alpha'
}

function computeFacets(index: EngineIndex, facets: string[], candidates: DocSet) {
  const distribution: Record<string, Record<string, number>> = {}
  const stats: Record<string, { min: number; max: number }> = {}
  for (const facet of [...new Set(facets)].sort(compareStrings)) {
    const column = index.column(facet)
    if (!column) {
      distribution[facet] = {}
      continue
    }
    const { counts, min, max } = column.distribution(candidates)
    const ordered = facetOrder(index, facet) === 'count' ? [...counts].sort((a, b) => b[1] - a[1]) : counts
    distribution[facet] = Object.fromEntries(ordered.slice(0, index.settings.faceting.maxValuesPerFacet))
    if (min <= max) stats[facet] = { min, max }
  }
  return { distribution, stats }
}

const CUSTOM_RULE = /^(.+):(asc|desc)$/

const GEO_POINT_IN_SORT = /_geoPoint\(\s*([\d.-]+)\s*,\s*([\d.-]+)\s*\)/

function distinctKey(document: StoredDocument, attribute: string): string | null {
  const values = document.flat.get(attribute)?.values ?? []
  if (values.length === 0) return null
  return JSON.stringify(values.map((value) => (typeof value === 'number' ? value : normalizeFacet(String(value)))).sort())
}

function checkSearchOn(index: EngineIndex, attributes: string[] | null): void {
  const searchable = index.settings.searchableAttributes
  for (const attribute of attributes ?? []) {
    if (!searchable.includes('*') && !searchable.some((pattern) => patternCovers(pattern, attribute))) {
      throw engineErrors.invalid(
        'invalid_search_attributes_to_search_on',
        `Index \`${index.uid}\`: Attribute \`${attribute}\` is not searchable. Available searchable attributes are: \`${searchable.join(', ')}\`.`,
      )
    }
  }
}

function checkDistinct(index: EngineIndex, attribute: string | null): void {
  if (attribute === null || isFilterable(index.settings, attribute)) return
  const patterns = filterablePatterns(index.settings)
  const available =
    patterns.length === 0
      ? 'This index does not have configured filterable attributes.'
      : `Available filterable attributes patterns are: \`${patterns.join(', ')}\`.`
  throw engineErrors.invalid(
    'invalid_search_distinct',
    `Index \`${index.uid}\`: Attribute \`${attribute}\` is not filterable and thus, cannot be used as distinct attribute. ${available}`,
  )
}

/** The hit as the engine shows it: displayed attributes, then the requested ones, then `_geoDistance`. */
function formatHit(
  document: StoredDocument,
  displayed: string[] | null,
  retrieve: string[] | null,
  geoSort: RegExpExecArray | undefined,
): JsonObject {
  let hit = projectDocument(document.body, displayed)
  if (retrieve) hit = projectDocument(hit, retrieve)
  if (geoSort && hit._geo && typeof hit._geo === 'object') {
    const geo = hit._geo as JsonObject
    const lat = finiteNumber(String(readPath(geo, 'lat')))
    const lng = finiteNumber(String(readPath(geo, 'lng')))
    if (lat !== null && lng !== null) hit._geoDistance = Math.round(haversineMetres(Number(geoSort[1]), Number(geoSort[2]), lat, lng))
  }
  return hit
}

/** Runs one search against an index and returns the engine's response body. */
export function executeSearch(index: EngineIndex, request: SearchRequest): Record<string, unknown> {
  const started = performance.now()
  const settings = index.settings
  const filtered = filterDocuments(index, request.filter, 'invalid_search_filter')
  checkSearchOn(index, request.attributesToSearchOn)
  const sortCriteria = checkSort(index, request.sort ?? [], 'invalid_search_sort', true)
  const distinctAttribute = request.distinct ?? settings.distinctAttribute
  checkDistinct(index, request.distinct)
  const facets = request.facets ? facetNames(index, request.facets) : null

  // Candidates: MiniSearch matches kept by the matching strategy, or every filtered document.
  // Without a query, a sort, custom rules or distinct the engine returns documents in internal
  // order, so then only the requested page is read.
  const query = parseQuery(request.q ?? '', new Set(settings.stopWords.map((word) => word.toLowerCase())))
  const textSearch = query.words.length > 0
  const unordered =
    !textSearch && sortCriteria.length === 0 && !distinctAttribute && !settings.rankingRules.some((rule) => CUSTOM_RULE.test(rule))
  const documents: StoredDocument[] = []
  const words: number[] = []
  const scores: number[] = []
  if (textSearch) {
    for (const match of index.text.search(query, request.attributesToSearchOn).values()) {
      if (filtered && !filtered.has(match.internalId)) continue
      let matched = 0
      if (request.matchingStrategy === 'frequency') matched = match.matchedWords.size
      else while (matched < query.words.length && match.matchedWords.has(query.words[matched])) matched++
      if (matched === 0 || (request.matchingStrategy === 'all' && matched < query.words.length)) continue
      documents.push(index.documentByInternalId(match.internalId)!)
      words.push(matched)
      scores.push(match.score)
    }
  } else if (!unordered) {
    for (const id of filtered ?? index.all()) documents.push(index.documentByInternalId(id)!)
  }

  // Ranking rules in their configured order; the relevance rules only act on a text query.
  const comparators: Comparator[] = []
  let relevanceApplied = false
  for (const rule of settings.rankingRules) {
    if (rule === 'words') {
      if (textSearch) comparators.push((a, b) => words[b] - words[a])
    } else if ((RELEVANCE_RULES as readonly string[]).includes(rule)) {
      // MiniSearch folds typos, prefixes, field weights and term frequency into one score.
      if (textSearch && !relevanceApplied) comparators.push((a, b) => scores[b] - scores[a])
      relevanceApplied = true
    } else if (rule === 'sort') {
      for (const criterion of sortCriteria) comparators.push(criterionComparator(index, documents, criterion))
    } else {
      const [, field, direction] = CUSTOM_RULE.exec(rule)!
      comparators.push(attributeComparator(documents, field, direction === 'asc'))
    }
  }

  const maxTotalHits = settings.pagination.maxTotalHits
  const finite = request.page !== null || request.hitsPerPage !== null
  let offset: number
  let limit: number
  if (finite) {
    const hitsPerPage = request.hitsPerPage ?? 20
    const page = request.page ?? 1
    ;[offset, limit] = page === 0 ? [0, 0] : [hitsPerPage * (page - 1), hitsPerPage]
  } else {
    offset = request.offset
    limit = request.limit
  }
  offset = Math.min(offset, maxTotalHits)
  limit = Math.min(limit, Math.max(0, maxTotalHits - offset))

  // The page of documents to show, how many candidates there are, and which to count facets on.
  let page: StoredDocument[]
  let candidateCount: number
  let facetPool: DocSet | StoredDocument[]
  if (unordered) {
    const pool = filtered ?? index.all()
    page = []
    let position = 0
    for (const id of pool) {
      if (position >= offset + limit) break
      if (position >= offset) page.push(index.documentByInternalId(id)!)
      position++
    }
    candidateCount = pool.size()
    facetPool = pool
  } else if (distinctAttribute) {
    const seen = new Set<string>()
    const ordered = orderPositions(documents, comparators, documents.length).map((position) => documents[position])
    const kept = ordered.filter((document) => {
      const key = distinctKey(document, distinctAttribute)
      if (key === null) return true
      if (seen.has(key)) return false
      seen.add(key)
      return true
    })
    page = kept.slice(offset, offset + limit)
    candidateCount = kept.length
    facetPool = kept
  } else {
    page = orderPositions(documents, comparators, Math.min(documents.length, offset + limit))
      .slice(offset)
      .map((position) => documents[position])
    candidateCount = documents.length
    facetPool = documents
  }

  const displayed = settings.displayedAttributes.includes('*') ? null : settings.displayedAttributes
  const retrieve = request.attributesToRetrieve && !request.attributesToRetrieve.includes('*') ? request.attributesToRetrieve : null
  const geoSort = (request.sort ?? []).map((text) => GEO_POINT_IN_SORT.exec(text)).find((match) => match !== null)
  const hits = page.map((document) => formatHit(document, displayed, retrieve, geoSort ?? undefined))

  let facetResult: ReturnType<typeof computeFacets> | null = null
  if (facets) {
    const candidates =
      facetPool instanceof DocSet
        ? facetPool
        : DocSet.of(
            index.capacity,
            facetPool.map((document) => document.internalId),
          )
    facetResult = computeFacets(index, facets, candidates)
  }

  const numberOfHits = Math.min(candidateCount, maxTotalHits)
  const response: Record<string, unknown> = { hits, query: request.q ?? '', processingTimeMs: Math.floor(performance.now() - started) }
  if (finite) {
    const hitsPerPage = request.hitsPerPage ?? 20
    response.hitsPerPage = hitsPerPage
    response.page = request.page ?? 1
    response.totalPages = hitsPerPage === 0 ? 0 : Math.ceil(numberOfHits / hitsPerPage)
    response.totalHits = numberOfHits
  } else {
    response.limit = request.limit
    response.offset = offset
    response.estimatedTotalHits = numberOfHits
  }
  if (facetResult) {
    response.facetDistribution = facetResult.distribution
    response.facetStats = facetResult.stats
  }
  response.requestUid = randomUUID()
  return response
}
