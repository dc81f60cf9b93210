// Recursive-descent parser for the Meilisearch filter language, written to follow the grammar of the
// engine's own `filter-parser` crate (meilisearch/meilisearch, crates/filter-parser/src/lib.rs,
// value.rs, condition.rs, error.rs) so that syntax errors carry the same wording and the same
// `start:end filter` position line.
//
// filter     = expression EOF
// expression = or
// or         = and ("OR" WS+ and)*
// and        = not ("AND" WS+ not)*
// not        = ("NOT" WS+ not) | primary
// primary    = "(" expression ")" | geoRadius | geoBoundingBox | in | not_in | condition
//              | is_null | is_not_null | is_empty | is_not_empty | exists | not_exists | to
//              | contains | not_contains | starts_with | not_starts_with
// value      = WS* ( word | 'single quoted' | "double quoted" ) WS*

export interface FilterToken {
  /** The value after quote removal and escape processing. */
  value: string
  /** Offsets into `source` (UTF-16 code units) of the token as written. */
  start: number
  end: number
  source: string
}

export type FilterCondition =
  | { kind: 'equal' | 'notEqual' | 'greaterThan' | 'greaterThanOrEqual' | 'lowerThan' | 'lowerThanOrEqual'; value: FilterToken }
  | { kind: 'between'; from: FilterToken; to: FilterToken }
  | { kind: 'exists' }
  | { kind: 'null' }
  | { kind: 'empty' }
  | { kind: 'contains' | 'startsWith'; keyword: FilterToken; word: FilterToken }

export type FilterNode =
  | { type: 'and'; children: FilterNode[] }
  | { type: 'or'; children: FilterNode[] }
  | { type: 'not'; child: FilterNode }
  | { type: 'condition'; field: FilterToken; condition: FilterCondition }
  | { type: 'in'; field: FilterToken; values: FilterToken[] }
  | { type: 'geoRadius'; lat: FilterToken; lng: FilterToken; radius: FilterToken }
  | { type: 'geoBoundingBox'; topRight: [FilterToken, FilterToken]; bottomLeft: [FilterToken, FilterToken] }

/** A filter the engine refuses; `message` is the full text Meilisearch would send. */
export class FilterSyntaxError extends Error {
  constructor(message: string) {
    super(message)
    this.name = 'FilterSyntaxError'
  }
}

const MAX_FILTER_DEPTH = 200

type ErrorKind =
  | { kind: 'expectedValue'; reservedKeyword: boolean }
  | { kind: 'malformedValue' }
  | { kind: 'missingClosingDelimiter'; delimiter: string }
  | { kind: 'invalidPrimary' }
  | { kind: 'invalidEscapedNumber' }
  | { kind: 'expectedEof' }
  | { kind: 'geoRadius' }
  | { kind: 'geoBoundingBox' }
  | { kind: 'reservedGeo'; name: string }
  | { kind: 'misusedGeoRadius' }
  | { kind: 'misusedGeoBoundingBox' }
  | { kind: 'reservedKeyword'; word: string }
  | { kind: 'inOpeningBracket' }
  | { kind: 'inClosingBracket' }
  | { kind: 'inExpectedValue' }
  | { kind: 'depthLimitReached' }
  | { kind: 'internal' }

/**
 * A parse failure at a span of the source. `fatal` mirrors nom's Failure (stop trying
 * alternatives) as opposed to Error (let the next alternative try).
 */
class ParseFailure {
  constructor(
    readonly fatal: boolean,
    readonly error: ErrorKind,
    readonly start: number,
    readonly end: number,
  ) {}
}

const KEYWORDS = new Set([
  'AND',
  'OR',
  'IN',
  'NOT',
  'TO',
  'EXISTS',
  'IS',
  'NULL',
  'EMPTY',
  'CONTAINS',
  'STARTS',
  'WITH',
  '_geoRadius',
  '_geoBoundingBox',
])

const VALUE_COMPONENT = /[\p{Alphabetic}\p{N}_.-]/u
const SYNTAX_COMPONENT = /[\s()=<>!]/u
const FLOAT = /[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/y

/** Rust's `str::escape_debug`, which the engine applies to the quoted fragment of a message. */
export function escapeDebug(text: string): string {
  let escaped = ''
  for (const char of text) {
    switch (char) {
      case '\\':
        escaped += '\\\\'
        break
      case '"':
        escaped += '\\"'
        break
      case "'":
        escaped += "\\'"
        break
      case '\n':
        escaped += '\\n'
        break
      case '\r':
        escaped += '\\r'
        break
      case '\t':
        escaped += '\\t'
        break
      case '\0':
        escaped += '\\0'
        break
      default: {
        const code = char.codePointAt(0)!
        escaped += code < 0x20 || code === 0x7f ? `\\u{${code.toString(16)}}` : char
      }
    }
  }
  return escaped
}

/** `start:end source`, columns counted in characters from 1 as the engine does. */
export function positionLine(source: string, start: number, end: number): string {
  const lineStart = source.lastIndexOf('\n', start - 1) + 1
  const column = [...source.slice(lineStart, start)].length + 1
  const size = [...source.slice(start, end)].length
  return `${column}:${column + size} ${source}`
}

/** An error message about a token, in the engine's two-line layout. */
export function messageAtToken(token: FilterToken, diagnostic: string): string {
  return `${diagnostic}\n${positionLine(token.source, token.start, token.end)}`
}

function describe(error: ErrorKind, fragment: string): string {
  const input = escapeDebug(fragment)
  switch (error.kind) {
    case 'expectedValue':
      if (fragment.trim() === '') return 'Was expecting a value but instead got nothing.'
      return error.reservedKeyword
        ? `Was expecting a value but instead got \`${input}\`, which is a reserved keyword. To use \`${input}\` as a field name or a value, surround it by quotes.`
        : `Was expecting a value but instead got \`${input}\`.`
    case 'malformedValue':
      return `Malformed value: \`${input}\`.`
    case 'missingClosingDelimiter':
      return `Expression \`${input}\` is missing the following closing delimiter: \`${error.delimiter}\`.`
    case 'invalidPrimary': {
      const text = fragment.trim() === '' ? 'but instead got nothing.' : `at \`${input}\`.`
      return `Was expecting an operation \`=\`, \`!=\`, \`>=\`, \`>\`, \`<=\`, \`<\`, \`IN\`, \`NOT IN\`, \`TO\`, \`EXISTS\`, \`NOT EXISTS\`, \`IS NULL\`, \`IS NOT NULL\`, \`IS EMPTY\`, \`IS NOT EMPTY\`, \`CONTAINS\`, \`NOT CONTAINS\`, \`STARTS WITH\`, \`NOT STARTS WITH\`, \`_geoRadius\`, or \`_geoBoundingBox\` ${text}`
    }
    case 'invalidEscapedNumber':
      return `Found an invalid escaped sequence number: \`${input}\`.`
    case 'expectedEof':
      return `Found unexpected characters at the end of the filter: \`${input}\`. You probably forgot an \`OR\` or an \`AND\` rule.`
    case 'geoRadius':
      return 'The `_geoRadius` filter expects three arguments: `_geoRadius(latitude, longitude, radius)`.'
    case 'geoBoundingBox':
      return 'The `_geoBoundingBox` filter expects two pairs of arguments: `_geoBoundingBox([latitude, longitude], [latitude, longitude])`.'
    case 'reservedGeo':
      return `\`${escapeDebug(error.name)}\` is a reserved keyword and thus can't be used as a filter expression. Use the \`_geoRadius(latitude, longitude, distance)\` or \`_geoBoundingBox([latitude, longitude], [latitude, longitude])\` built-in rules to filter on \`_geo\` coordinates.`
    case 'misusedGeoRadius':
      return "The `_geoRadius` filter is an operation and can't be used as a value."
    case 'misusedGeoBoundingBox':
      return "The `_geoBoundingBox` filter is an operation and can't be used as a value."
    case 'reservedKeyword':
      return `\`${error.word}\` is a reserved keyword and thus cannot be used as a field name unless it is put inside quotes. Use "${error.word}" or '${error.word}' instead.`
    case 'inOpeningBracket':
      return 'Expected `[` after `IN` keyword.'
    case 'inClosingBracket':
      return 'Expected matching `]` after the list of field names given to `IN[`'
    case 'inExpectedValue':
      return `Expected only comma-separated field names inside \`IN[..]\` but instead found \`${input}\`.`
    case 'depthLimitReached':
      return 'The filter exceeded the maximum depth limit. Try rewriting the filter so that it contains fewer nested conditions.'
    case 'internal':
      return 'Encountered an internal error while parsing your filter. Please fill an issue'
  }
}

/** Backslash escapes the engine resolves inside values (the `unescaper` crate's set). */
function unescapeSequences(raw: string, start: number): string {
  if (!raw.includes('\\')) return raw
  let out = ''
  for (let i = 0; i < raw.length; i++) {
    const char = raw[i]
    if (char !== '\\') {
      out += char
      continue
    }
    const next = raw[++i]
    const simple: Record<string, string> = {
      b: '\b',
      f: '\f',
      n: '\n',
      r: '\r',
      t: '\t',
      '"': '"',
      "'": "'",
      '\\': '\\',
      '/': '/',
      '0': '\0',
    }
    if (next !== undefined && next in simple) {
      out += simple[next]
    } else if (next === 'x' && /^[0-9a-fA-F]{2}$/.test(raw.slice(i + 1, i + 3))) {
      out += String.fromCharCode(parseInt(raw.slice(i + 1, i + 3), 16))
      i += 2
    } else if (next === 'u' && raw[i + 1] === '{') {
      const close = raw.indexOf('}', i)
      const digits = close === -1 ? '' : raw.slice(i + 2, close)
      if (!/^[0-9a-fA-F]{1,6}$/.test(digits)) throw new ParseFailure(false, { kind: 'invalidEscapedNumber' }, start, start + raw.length)
      out += String.fromCodePoint(parseInt(digits, 16))
      i = close
    } else if (next === 'u' && /^[0-9a-fA-F]{4}$/.test(raw.slice(i + 1, i + 5))) {
      out += String.fromCharCode(parseInt(raw.slice(i + 1, i + 5), 16))
      i += 4
    } else {
      throw new ParseFailure(false, { kind: 'malformedValue' }, start, start + raw.length)
    }
  }
  return out
}

class Parser {
  constructor(readonly src: string) {}

  private fail(fatal: boolean, error: ErrorKind, start: number, end = this.src.length): never {
    throw new ParseFailure(fatal, error, start, end)
  }

  private token(value: string, start: number, end: number): FilterToken {
    return { value, start, end, source: this.src }
  }

  /** nom's `multispace0`: spaces, tabs, carriage returns and line feeds. */
  private spaces(at: number): number {
    while (at < this.src.length && ' \t\r\n'.includes(this.src[at])) at++
    return at
  }

  private unicodeSpaces(at: number): number {
    while (at < this.src.length && /\s/u.test(this.src[at])) at++
    return at
  }

  /** End of the run of value characters starting at `at` (word = (alphanumeric | _ | - | .)+). */
  private wordEnd(at: number): number {
    let end = at
    while (end < this.src.length) {
      const char = String.fromCodePoint(this.src.codePointAt(end)!)
      if (!VALUE_COMPONENT.test(char)) break
      end += char.length
    }
    return end
  }

  /** `word_exact(tag)`: the whole word at `at` must be `tag`; returns the position after it. */
  private wordExact(at: number, tag: string): number | null {
    const end = this.wordEnd(at)
    return end > at && this.src.slice(at, end) === tag ? end : null
  }

  private tag(at: number, tag: string): number | null {
    return this.src.startsWith(tag, at) ? at + tag.length : null
  }

  /** nom's `multispace1`. */
  private spaces1(at: number): number | null {
    const end = this.spaces(at)
    return end > at ? end : null
  }

  private float(at: number): { token: FilterToken; next: number } | null {
    FLOAT.lastIndex = at
    const match = FLOAT.exec(this.src)
    if (!match) return null
    const next = at + match[0].length
    return { token: this.token(match[0], at, next), next }
  }

  /** ws(recognize_float) separated by commas, at least one. */
  private floatList(at: number): { tokens: FilterToken[]; next: number } | null {
    const tokens: FilterToken[] = []
    let position = at
    for (;;) {
      const parsed = this.float(this.spaces(position))
      if (!parsed) {
        if (tokens.length === 0) return null
        return { tokens, next: position }
      }
      tokens.push(parsed.token)
      position = this.spaces(parsed.next)
      const comma = this.tag(position, ',')
      if (comma === null) return { tokens, next: position }
      const lookahead = this.float(this.spaces(comma))
      if (!lookahead) return { tokens, next: position }
      position = comma
    }
  }

  // value ------------------------------------------------------------------------------------------

  /** The geo names that may never appear as a value; a match is a hard failure. */
  private rejectReservedGeo(at: number): void {
    if (this.src.startsWith('_geoPoint', at)) this.fail(true, { kind: 'reservedGeo', name: '_geoPoint' }, at)
    if (this.src.startsWith('_geoDistance', at)) this.fail(true, { kind: 'reservedGeo', name: '_geoDistance' }, at)
    if (this.wordExact(at, '_geo') !== null) this.fail(true, { kind: 'reservedGeo', name: '_geo' }, at)
  }

  private quoted(at: number, quote: string): { token: FilterToken; next: number } {
    const contentStart = at + 1
    let escaped = false
    let position = contentStart
    while (position < this.src.length) {
      const char = this.src[position]
      if (char === quote) break
      if (char === '\\') {
        if (position + 1 >= this.src.length) this.fail(true, { kind: 'malformedValue' }, contentStart)
        escaped ||= this.src[position + 1] === quote
        position += 2
        continue
      }
      position++
    }
    if (position >= this.src.length) {
      this.fail(true, { kind: 'missingClosingDelimiter', delimiter: quote }, at)
    }
    let raw = this.src.slice(contentStart, position)
    if (escaped) raw = raw.split(`\\${quote}`).join(quote)
    const value = unescapeSequences(raw, contentStart)
    return { token: this.token(value, contentStart, position), next: position + 1 }
  }

  /** value = WS* ( word | singleQuoted | doubleQuoted ) WS* */
  parseValue(at: number): { token: FilterToken; next: number } {
    const start = this.unicodeSpaces(at)
    this.rejectReservedGeo(start)
    const afterSpaces = this.spaces(start)
    if (this.wordExact(afterSpaces, '_geoRadius') !== null) this.fail(true, { kind: 'misusedGeoRadius' }, start)
    if (this.wordExact(afterSpaces, '_geoBoundingBox') !== null) this.fail(true, { kind: 'misusedGeoBoundingBox' }, start)

    const first = this.src[start]
    let parsed: { token: FilterToken; next: number }
    if (first === "'" || first === '"') {
      parsed = this.quoted(start, first)
    } else {
      const end = this.wordEnd(start)
      const word = this.src.slice(start, end)
      if (end === start || KEYWORDS.has(word)) {
        let errorEnd = start
        while (errorEnd < this.src.length && !SYNTAX_COMPONENT.test(this.src[errorEnd])) errorEnd++
        this.fail(false, { kind: 'expectedValue', reservedKeyword: end > start }, start, errorEnd)
      }
      parsed = { token: this.token(unescapeSequences(word, start), start, end), next: end }
    }
    return { token: parsed.token, next: this.spaces(parsed.next) }
  }

  // combinators ------------------------------------------------------------------------------------

  /** Runs `parser`, turning a recoverable error into a hard failure (nom's `cut`). */
  private cut<T>(parser: () => T): T {
    try {
      return parser()
    } catch (failure) {
      if (failure instanceof ParseFailure && !failure.fatal) {
        throw new ParseFailure(true, failure.error, failure.start, failure.end)
      }
      throw failure
    }
  }

  /** Tries each alternative in order; a hard failure stops the search. Returns the last error. */
  private alt<T>(alternatives: Array<() => T>): T {
    let last: ParseFailure | undefined
    for (const alternative of alternatives) {
      try {
        return alternative()
      } catch (failure) {
        if (!(failure instanceof ParseFailure) || failure.fatal) throw failure
        last = failure
      }
    }
    throw last
  }

  // grammar ----------------------------------------------------------------------------------------

  parseFilter(): FilterNode {
    const { node, next } = this.parseOr(0, 0)
    if (next < this.src.length) this.fail(false, { kind: 'expectedEof' }, next)
    return node
  }

  private parseOr(at: number, depth: number): { node: FilterNode; next: number } {
    return this.parseChain(at, depth, 'OR', (position) => this.parseAnd(position, depth + 1))
  }

  private parseAnd(at: number, depth: number): { node: FilterNode; next: number } {
    return this.parseChain(at, depth, 'AND', (position) => this.parseNot(position, depth + 1))
  }

  /** operand (keyword WS+ operand)*; once the keyword is read an operand must follow. */
  private parseChain(
    at: number,
    depth: number,
    keyword: 'OR' | 'AND',
    operand: (at: number) => { node: FilterNode; next: number },
  ): { node: FilterNode; next: number } {
    if (depth > MAX_FILTER_DEPTH) this.fail(false, { kind: 'depthLimitReached' }, at)
    const first = operand(at)
    const children = [first.node]
    let next = first.next
    for (;;) {
      const after = this.wordExact(this.spaces(next), keyword)
      if (after === null) break
      const rest = this.cut(() => operand(this.spaces(after)))
      children.push(rest.node)
      next = rest.next
    }
    if (children.length === 1) return first
    return { node: keyword === 'OR' ? { type: 'or', children } : { type: 'and', children }, next }
  }

  private parseNot(at: number, depth: number): { node: FilterNode; next: number } {
    if (depth > MAX_FILTER_DEPTH) this.fail(false, { kind: 'depthLimitReached' }, at)
    return this.alt([
      () => {
        const keyword = this.wordExact(this.spaces(at), 'NOT')
        if (keyword === null) this.fail(false, { kind: 'internal' }, at)
        const inner = this.cut(() => this.parseNot(this.spaces(keyword), depth + 1))
        return { node: negate(inner.node), next: inner.next }
      },
      () => this.parsePrimary(at, depth + 1),
    ])
  }

  private parsePrimary(at: number, depth: number): { node: FilterNode; next: number } {
    if (depth > MAX_FILTER_DEPTH) this.fail(false, { kind: 'depthLimitReached' }, at)
    try {
      return this.alt<{ node: FilterNode; next: number }>([
        () => {
          const open = this.tag(this.spaces(at), '(')
          if (open === null) this.fail(false, { kind: 'internal' }, at)
          const inner = this.cut(() => this.parseOr(this.spaces(open), depth + 1))
          const close = this.tag(this.spaces(inner.next), ')')
          if (close === null) this.fail(true, { kind: 'missingClosingDelimiter', delimiter: ')' }, at)
          return { node: inner.node, next: this.spaces(close) }
        },
        () => this.parseGeoRadius(at),
        () => this.parseGeoBoundingBox(at),
        () => this.parseIn(at),
        () => this.parseNotIn(at),
        () => this.parseComparison(at),
        () => this.parseKeywordCondition(at, ['IS', 'NULL'], { kind: 'null' }, false),
        () => this.parseKeywordCondition(at, ['IS', 'NOT', 'NULL'], { kind: 'null' }, true),
        () => this.parseKeywordCondition(at, ['IS', 'EMPTY'], { kind: 'empty' }, false),
        () => this.parseKeywordCondition(at, ['IS', 'NOT', 'EMPTY'], { kind: 'empty' }, true),
        () => this.parseKeywordCondition(at, ['EXISTS'], { kind: 'exists' }, false),
        () => this.parseKeywordCondition(at, ['NOT', 'EXISTS'], { kind: 'exists' }, true),
        () => this.parseTo(at),
        () => this.parseWordCondition(at, ['CONTAINS'], 'contains', false),
        () => this.parseWordCondition(at, ['NOT', 'CONTAINS'], 'contains', true),
        () => this.parseWordCondition(at, ['STARTS WITH'], 'startsWith', false),
        () => this.parseWordCondition(at, ['NOT', 'STARTS WITH'], 'startsWith', true),
        () => this.rejectGeoExpression(at),
        () => {
          try {
            return this.parseComparison(at)
          } catch (failure) {
            if (failure instanceof ParseFailure && failure.error.kind === 'expectedValue' && failure.error.reservedKeyword) {
              throw new ParseFailure(true, failure.error, failure.start, failure.end)
            }
            throw failure
          }
        },
      ])
    } catch (failure) {
      if (failure instanceof ParseFailure && !failure.fatal) this.fail(false, { kind: 'invalidPrimary' }, at)
      throw failure
    }
  }

  /** _geoRadius(lat, lng, radius); once the name is read, anything wrong is a hard failure. */
  private parseGeoRadius(at: number): { node: FilterNode; next: number } {
    const name = this.wordExact(this.spaces(at), '_geoRadius')
    if (name === null) this.fail(false, { kind: 'geoRadius' }, at)
    const open = this.tag(name, '(')
    const args = open === null ? null : this.floatList(open)
    const close = args === null ? null : this.tag(args.next, ')')
    if (args === null || close === null) this.fail(true, { kind: 'geoRadius' }, at)
    if (args.tokens.length !== 3) this.fail(true, { kind: 'geoRadius' }, close)
    const [lat, lng, radius] = args.tokens
    return { node: { type: 'geoRadius', lat, lng, radius }, next: close }
  }

  /** _geoBoundingBox([lat, lng], [lat, lng]): top-right corner first, then bottom-left. */
  private parseGeoBoundingBox(at: number): { node: FilterNode; next: number } {
    const name = this.wordExact(this.spaces(at), '_geoBoundingBox')
    if (name === null) this.fail(false, { kind: 'geoBoundingBox' }, at)
    const open = this.tag(name, '(')
    if (open === null) this.fail(true, { kind: 'geoBoundingBox' }, at)
    const pairs: FilterToken[][] = []
    let position = open
    for (;;) {
      const bracket = this.tag(this.spaces(position), '[')
      const list = bracket === null ? null : this.floatList(bracket)
      const closeBracket = list === null ? null : this.tag(list.next, ']')
      if (list === null || closeBracket === null) {
        if (pairs.length === 0) this.fail(true, { kind: 'geoBoundingBox' }, at)
        break
      }
      pairs.push(list.tokens)
      position = this.spaces(closeBracket)
      const comma = this.tag(position, ',')
      if (comma === null) break
      const lookahead = this.tag(this.spaces(comma), '[')
      if (lookahead === null) break
      position = comma
    }
    const close = this.tag(position, ')')
    if (close === null) this.fail(true, { kind: 'geoBoundingBox' }, at)
    if (pairs.length !== 2 || pairs[0].length !== 2 || pairs[1].length !== 2) {
      this.fail(true, { kind: 'geoBoundingBox' }, close)
    }
    return {
      node: { type: 'geoBoundingBox', topRight: [pairs[0][0], pairs[0][1]], bottomLeft: [pairs[1][0], pairs[1][1]] },
      next: close,
    }
  }

  /** "IN" WS* "[" value_list "]" after the field. */
  private parseInBody(at: number): { values: FilterToken[]; next: number } {
    const keyword = this.wordExact(this.spaces(at), 'IN')
    if (keyword === null) this.fail(false, { kind: 'internal' }, at)
    const afterKeyword = this.spaces(keyword)
    const open = this.tag(afterKeyword, '[')
    if (open === null) this.fail(true, { kind: 'inOpeningBracket' }, afterKeyword)

    const values: FilterToken[] = []
    let position = open
    const first = this.optionalValue(position)
    if (first) {
      values.push(first.token)
      position = first.next
      for (;;) {
        const comma = this.tag(this.spaces(position), ',')
        if (comma === null) break
        const next = this.optionalValue(this.spaces(comma))
        if (!next) break
        values.push(next.token)
        position = next.next
      }
      const trailing = this.tag(this.spaces(position), ',')
      if (trailing !== null) position = this.spaces(trailing)
    }
    const close = this.tag(this.spaces(position), ']')
    if (close === null) {
      if (position >= this.src.length) this.fail(true, { kind: 'inClosingBracket' }, position)
      this.fail(true, { kind: 'inExpectedValue' }, position)
    }
    return { values, next: this.spaces(close) }
  }

  private optionalValue(at: number): { token: FilterToken; next: number } | null {
    try {
      return this.parseValue(at)
    } catch (failure) {
      if (failure instanceof ParseFailure && !failure.fatal) return null
      throw failure
    }
  }

  private parseIn(at: number): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    const body = this.parseInBody(field.next)
    return { node: { type: 'in', field: field.token, values: body.values }, next: body.next }
  }

  private parseNotIn(at: number): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    const keyword = this.wordExact(field.next, 'NOT')
    if (keyword === null) this.fail(false, { kind: 'internal' }, field.next)
    const body = this.parseInBody(keyword)
    return { node: { type: 'not', child: { type: 'in', field: field.token, values: body.values } }, next: body.next }
  }

  /** value ("<=" | ">=" | "!=" | "<" | ">" | "=") value */
  private parseComparison(at: number): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    const operators = [
      ['<=', 'lowerThanOrEqual'],
      ['>=', 'greaterThanOrEqual'],
      ['!=', 'notEqual'],
      ['<', 'lowerThan'],
      ['>', 'greaterThan'],
      ['=', 'equal'],
    ] as const
    const operator = operators.find(([symbol]) => this.src.startsWith(symbol, field.next))
    if (!operator) this.fail(false, { kind: 'internal' }, field.next)
    const value = this.cut(() => this.parseValue(field.next + operator[0].length))
    return {
      node: { type: 'condition', field: field.token, condition: { kind: operator[1], value: value.token } },
      next: value.next,
    }
  }

  /** A field followed by fixed keywords separated by at least one space: `x IS NOT NULL`. */
  private parseKeywordCondition(
    at: number,
    words: string[],
    condition: FilterCondition,
    negated: boolean,
  ): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    let position = field.next
    words.forEach((word, index) => {
      if (index > 0) {
        const spaced = this.spaces1(position)
        if (spaced === null) this.fail(false, { kind: 'internal' }, position)
        position = spaced
      }
      const after = this.tag(position, word)
      if (after === null) this.fail(false, { kind: 'internal' }, position)
      position = after
    })
    const node: FilterNode = { type: 'condition', field: field.token, condition }
    return { node: negated ? { type: 'not', child: node } : node, next: position }
  }

  /** value value "TO" WS+ value */
  private parseTo(at: number): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    const from = this.parseValue(field.next)
    const keyword = this.tag(from.next, 'TO')
    const spaced = keyword === null ? null : this.spaces1(keyword)
    if (spaced === null) this.fail(false, { kind: 'internal' }, from.next)
    const to = this.cut(() => this.parseValue(spaced))
    return {
      node: { type: 'condition', field: field.token, condition: { kind: 'between', from: from.token, to: to.token } },
      next: to.next,
    }
  }

  private parseWordCondition(
    at: number,
    words: string[],
    kind: 'contains' | 'startsWith',
    negated: boolean,
  ): { node: FilterNode; next: number } {
    const field = this.parseValue(at)
    let position = field.next
    let keywordStart = position
    words.forEach((word, index) => {
      if (index > 0) {
        const spaced = this.spaces1(position)
        if (spaced === null) this.fail(false, { kind: 'internal' }, position)
        position = spaced
      }
      keywordStart = position
      const after = this.tag(position, word)
      if (after === null) this.fail(false, { kind: 'internal' }, position)
      position = after
    })
    const keyword = this.token(words[words.length - 1], keywordStart, position)
    const word = this.cut(() => this.parseValue(position))
    const node: FilterNode = { type: 'condition', field: field.token, condition: { kind, keyword, word: word.token } }
    return { node: negated ? { type: 'not', child: node } : node, next: word.next }
  }

  /** `_geo(…)`, `_geoDistance(…)` and `_geoPoint(…)` are never valid filter expressions. */
  private rejectGeoExpression(at: number): never {
    const start = this.spaces(at)
    if (this.wordExact(start, '_geo') !== null) this.fail(true, { kind: 'reservedGeo', name: '_geo' }, at)
    if (this.src.startsWith('_geoDistance', start)) this.fail(true, { kind: 'reservedGeo', name: '_geoDistance' }, at)
    if (this.src.startsWith('_geoPoint', start)) this.fail(true, { kind: 'reservedGeo', name: '_geoPoint' }, at)
    this.fail(false, { kind: 'internal' }, at)
  }
}

/** NOT NOT x is x, as in the engine. */
function negate(node: FilterNode): FilterNode {
  return node.type === 'not' ? node.child : { type: 'not', child: node }
}

/** Parses one filter string; an empty or blank string is no filter at all. */
export function parseFilterString(source: string): FilterNode | null {
  if (source.trim() === '') return null
  const parser = new Parser(source)
  try {
    return parser.parseFilter()
  } catch (failure) {
    if (failure instanceof ParseFailure) {
      const fragment = source.slice(failure.start, failure.end)
      throw new FilterSyntaxError(`${describe(failure.error, fragment)}\n${positionLine(source, failure.start, failure.end)}`)
    }
    throw failure
  }
}

function invalidExpression(expected: string, found: unknown): FilterSyntaxError {
  return new FilterSyntaxError(`Invalid syntax for the filter parameter: \`expected ${expected}, found: ${JSON.stringify(found)}\`.`)
}

/**
 * Parses the `filter` search parameter: a string, or an array whose string members are ANDed and
 * whose inner arrays are ORed (`["a = 1", ["b = 2", "b = 3"]]`).
 */
export function parseFilter(filter: unknown): FilterNode | null {
  if (filter === null || filter === undefined) return null
  if (typeof filter === 'string') return parseFilterString(filter)
  if (!Array.isArray(filter)) throw invalidExpression('String, Array', filter)

  const ands: FilterNode[] = []
  for (const member of filter) {
    if (typeof member === 'string') {
      const node = parseFilterString(member)
      if (node) ands.push(node)
    } else if (Array.isArray(member)) {
      const ors: FilterNode[] = []
      for (const alternative of member) {
        if (typeof alternative !== 'string') throw invalidExpression('String', alternative)
        const node = parseFilterString(alternative)
        if (node) ors.push(node)
      }
      if (ors.length === 1) ands.push(ors[0])
      else if (ors.length > 1) ands.push({ type: 'or', children: ors })
    } else {
      throw invalidExpression('String, [String]', member)
    }
  }
  if (ands.length === 0) return null
  return ands.length === 1 ? ands[0] : { type: 'and', children: ands }
}

/** Every field a filter reads, in order of appearance (the engine checks them in this order). */
export function filterFields(node: FilterNode): FilterToken[] {
  switch (node.type) {
    case 'and':
    case 'or':
      return node.children.flatMap(filterFields)
    case 'not':
      return filterFields(node.child)
    case 'condition':
    case 'in':
      return [node.field]
    default:
      return []
  }
}
