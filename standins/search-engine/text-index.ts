// Full-text matching through MiniSearch. The stand-in only configures it the way the engine
// behaves: typo budgets by word length (1 typo from 5 letters, 2 from 9, the engine's
// `minWordSizeForTypos` defaults), prefix search on the last query word, accents and case
// ignored, earlier searchable attributes weighted higher. Scores are MiniSearch's own (BM25+).

import MiniSearch, { type SearchResult } from 'minisearch'

import { readPath, searchableText, type JsonObject } from './document-fields'
import type { IndexSettings } from './settings'

const ID_FIELD = '\u0000internalId'
const MAX_QUERY_WORDS = 10

interface TextEntry {
  [ID_FIELD]: number
  document: JsonObject
}

export interface TextMatch {
  internalId: number
  score: number
  /** Query words (normalised) this document matched. */
  matchedWords: Set<string>
}

export interface ParsedQuery {
  /** Normalised words in query order, stop words removed, at most ten as in the engine. */
  words: string[]
  /** Words written with a leading `-`, which exclude documents containing them. */
  excluded: string[]
}

const tokenize = MiniSearch.getDefault('tokenize') as (text: string) => string[]

/** Lower case without diacritics, close to the engine's tokenizer normalisation. */
export function normalizeWord(term: string): string {
  return term.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase()
}

export function parseQuery(q: string, stopWords: Set<string>): ParsedQuery {
  const words: string[] = []
  const excluded: string[] = []
  for (const part of q.split(/\s+/)) {
    const negative = part.length > 1 && part.startsWith('-')
    for (const token of tokenize(negative ? part.slice(1) : part)) {
      const word = normalizeWord(token)
      if (!word || stopWords.has(word)) continue
      if (negative) excluded.push(word)
      else words.push(word)
    }
  }
  return { words: words.slice(0, MAX_QUERY_WORDS), excluded }
}

export class TextIndex {
  private mini: MiniSearch<TextEntry> | null = null
  private fields: string[] = []
  private stale = true

  constructor(
    private readonly settings: () => IndexSettings,
    private readonly allDocuments: () => Iterable<[number, JsonObject]>,
    private readonly topLevelFields: () => string[],
  ) {}

  /** Settings that change what is indexed force a rebuild on the next search. */
  invalidate(): void {
    this.stale = true
  }

  upsert(internalId: number, document: JsonObject): void {
    if (!this.mini || this.stale) return
    if (this.settings().searchableAttributes.includes('*') && Object.keys(document).some((key) => !this.fields.includes(key))) {
      this.stale = true
      return
    }
    const entry: TextEntry = { [ID_FIELD]: internalId, document }
    if (this.mini.has(internalId)) this.mini.replace(entry)
    else this.mini.add(entry)
  }

  remove(internalId: number): void {
    if (this.mini && !this.stale && this.mini.has(internalId)) this.mini.discard(internalId)
  }

  private searchableFields(): string[] {
    const searchable = this.settings().searchableAttributes
    return searchable.includes('*') ? this.topLevelFields() : searchable
  }

  private build(): MiniSearch<TextEntry> {
    this.fields = this.searchableFields()
    const mini = new MiniSearch<TextEntry>({
      idField: ID_FIELD,
      fields: this.fields.length > 0 ? this.fields : [ID_FIELD],
      extractField: (entry, field) => (field === ID_FIELD ? entry[ID_FIELD] : searchableText(readPath(entry.document, field))) as string,
      processTerm: (term) => normalizeWord(term) || null,
      autoVacuum: true,
    })
    const entries: TextEntry[] = []
    for (const [internalId, document] of this.allDocuments()) entries.push({ [ID_FIELD]: internalId, document })
    mini.addAll(entries)
    this.mini = mini
    this.stale = false
    return mini
  }

  /** Allowed typos for one query word under the typo tolerance settings. */
  private typoBudget(word: string): number {
    const typo = this.settings().typoTolerance
    if (!typo.enabled || typo.disableOnWords.map(normalizeWord).includes(word)) return 0
    if (typo.disableOnNumbers && /^\d+$/.test(word)) return 0
    const length = [...word].length
    if (length >= typo.minWordSizeForTypos.twoTypos) return 2
    if (length >= typo.minWordSizeForTypos.oneTypo) return 1
    return 0
  }

  search(query: ParsedQuery, restrictTo: string[] | null): Map<number, TextMatch> {
    const mini = this.stale || !this.mini ? this.build() : this.mini
    const matches = new Map<number, TextMatch>()
    if (query.words.length === 0 || this.fields.length === 0) return matches

    const fields = restrictTo ?? this.fields
    const explicit = !this.settings().searchableAttributes.includes('*')
    const boost = explicit ? Object.fromEntries(this.fields.map((field, index) => [field, this.fields.length - index])) : {}
    const prefixAllowed = this.settings().prefixSearch !== 'disabled'
    const identity = { tokenize: (text: string) => text.split(' '), processTerm: (term: string) => term }

    const results: SearchResult[] = mini.search(query.words.join(' '), {
      ...identity,
      fields,
      boost,
      combineWith: 'OR',
      fuzzy: (word) => this.typoBudget(word),
      prefix: (_word, index, words) => prefixAllowed && index === words.length - 1,
    })
    for (const result of results) {
      matches.set(result.id as number, { internalId: result.id as number, score: result.score, matchedWords: new Set(result.queryTerms) })
    }

    if (query.excluded.length > 0) {
      for (const result of mini.search(query.excluded.join(' '), { ...identity, fields, combineWith: 'OR' })) {
        matches.delete(result.id as number)
      }
    }
    return matches
  }
}
