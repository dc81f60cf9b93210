// The stand-in's filter parser against the engine's own parser tests. Every expected string below
// is copied from the insta snapshots in meilisearch/meilisearch, crates/filter-parser/src/lib.rs
// (tests `parse` and `error`), which print a parsed filter as `{field} = {value}`, `AND[…, ]`,
// `NOT (…)` and so on; `display` reproduces that printer so the two can be compared directly.

import { describe, expect, it } from 'vitest'

import {
  FilterSyntaxError,
  filterFields,
  parseFilter,
  parseFilterString,
  type FilterNode,
} from '../../standins/search-engine/filter-parser'

function display(node: FilterNode): string {
  const token = (value: { value: string }) => `{${value.value}}`
  switch (node.type) {
    case 'not':
      return `NOT (${display(node.child)})`
    case 'and':
      return `AND[${node.children.map((child) => `${display(child)}, `).join('')}]`
    case 'or':
      return `OR[${node.children.map((child) => `${display(child)}, `).join('')}]`
    case 'in':
      return `${token(node.field)} IN[${node.values.map((value) => `${token(value)}, `).join('')}]`
    case 'geoRadius':
      return `_geoRadius(${token(node.lat)}, ${token(node.lng)}, ${token(node.radius)})`
    case 'geoBoundingBox':
      return `_geoBoundingBox([${token(node.topRight[0])}, ${token(node.topRight[1])}], [${token(node.bottomLeft[0])}, ${token(node.bottomLeft[1])}])`
    case 'condition': {
      const field = token(node.field)
      const condition = node.condition
      switch (condition.kind) {
        case 'equal':
          return `${field} = ${token(condition.value)}`
        case 'notEqual':
          return `${field} != ${token(condition.value)}`
        case 'greaterThan':
          return `${field} > ${token(condition.value)}`
        case 'greaterThanOrEqual':
          return `${field} >= ${token(condition.value)}`
        case 'lowerThan':
          return `${field} < ${token(condition.value)}`
        case 'lowerThanOrEqual':
          return `${field} <= ${token(condition.value)}`
        case 'between':
          return `${field} ${token(condition.from)} TO ${token(condition.to)}`
        case 'exists':
          return `${field} EXISTS`
        case 'null':
          return `${field} IS NULL`
        case 'empty':
          return `${field} IS EMPTY`
        case 'contains':
          return `${field} CONTAINS ${token(condition.word)}`
        case 'startsWith':
          return `${field} STARTS WITH ${token(condition.word)}`
      }
    }
  }
}

const parsed = (filter: string): string => {
  const node = parseFilterString(filter)
  if (!node) throw new Error(`no filter parsed from ${filter}`)
  return display(node)
}

function syntaxError(filter: string): string {
  try {
    parseFilterString(filter)
  } catch (error) {
    if (error instanceof FilterSyntaxError) return error.message
    throw error
  }
  throw new Error(`expected ${filter} to be rejected`)
}

const OPERATIONS =
  'Was expecting an operation `=`, `!=`, `>=`, `>`, `<=`, `<`, `IN`, `NOT IN`, `TO`, `EXISTS`, `NOT EXISTS`, `IS NULL`, `IS NOT NULL`, `IS EMPTY`, `IS NOT EMPTY`, `CONTAINS`, `NOT CONTAINS`, `STARTS WITH`, `NOT STARTS WITH`, `_geoRadius`, or `_geoBoundingBox`'

describe('filter parser: accepted filters (expected trees from the engine parser snapshots)', () => {
  it.each([
    ['channel = Ponce', '{channel} = {Ponce}'],
    ['subscribers = 12', '{subscribers} = {12}'],
    ["channel = 'Mister Mv'", '{channel} = {Mister Mv}'],
    ['channel = "Mister Mv"', '{channel} = {Mister Mv}'],
    ["'dog race' = Borzoi", '{dog race} = {Borzoi}'],
    ['"dog race" = "Bernese Mountain"', '{dog race} = {Bernese Mountain}'],
    ['"dog race" = \'Bernese Mountain\'', '{dog race} = {Bernese Mountain}'],
  ])('equality with quoted and bare values: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it.each([
    ['colour IN[]', '{colour} IN[]'],
    ['colour IN[green]', '{colour} IN[{green}, ]'],
    ['colour IN[green,]', '{colour} IN[{green}, ]'],
    ['colour NOT IN[green,blue]', 'NOT ({colour} IN[{green}, {blue}, ])'],
    [' colour IN [  green , blue , ]', '{colour} IN[{green}, {blue}, ]'],
    [' colour IN [green, blue]  AND color = green ', 'AND[{colour} IN[{green}, {blue}, ], {color} = {green}, ]'],
    ['NOT (colour IN [green, blue])  AND color = green ', 'AND[NOT ({colour} IN[{green}, {blue}, ]), {color} = {green}, ]'],
    [
      'x = 1 OR NOT (colour IN [green, blue]  OR color = green) ',
      'OR[{x} = {1}, NOT (OR[{colour} IN[{green}, {blue}, ], {color} = {green}, ]), ]',
    ],
    [' colour NOT  IN [green, blue] ', 'NOT ({colour} IN[{green}, {blue}, ])'],
  ])('IN and NOT IN lists: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it.each([
    ['channel != ponce', '{channel} != {ponce}'],
    ['NOT channel = ponce', 'NOT ({channel} = {ponce})'],
    ['subscribers < 1000', '{subscribers} < {1000}'],
    ['subscribers > 1000', '{subscribers} > {1000}'],
    ['subscribers <= 1000', '{subscribers} <= {1000}'],
    ['subscribers >= 1000', '{subscribers} >= {1000}'],
    ['subscribers 100 TO 1000', '{subscribers} {100} TO {1000}'],
    ['NOT subscribers < 1000', 'NOT ({subscribers} < {1000})'],
    ['NOT subscribers 100 TO 1000', 'NOT ({subscribers} {100} TO {1000})'],
  ])('comparisons and ranges: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it.each([
    ['subscribers IS NULL', '{subscribers} IS NULL'],
    ['NOT subscribers IS NULL', 'NOT ({subscribers} IS NULL)'],
    ['subscribers IS NOT NULL', 'NOT ({subscribers} IS NULL)'],
    ['NOT subscribers IS NOT NULL', '{subscribers} IS NULL'],
    ['subscribers  IS   NOT   NULL', 'NOT ({subscribers} IS NULL)'],
    ['subscribers IS EMPTY', '{subscribers} IS EMPTY'],
    ['subscribers IS NOT EMPTY', 'NOT ({subscribers} IS EMPTY)'],
    ['NOT subscribers IS NOT EMPTY', '{subscribers} IS EMPTY'],
    ['subscribers EXISTS', '{subscribers} EXISTS'],
    ['NOT subscribers EXISTS', 'NOT ({subscribers} EXISTS)'],
    ['subscribers NOT EXISTS', 'NOT ({subscribers} EXISTS)'],
    ['NOT subscribers NOT EXISTS', '{subscribers} EXISTS'],
    ['subscribers NOT   EXISTS', 'NOT ({subscribers} EXISTS)'],
    ["subscribers STARTS WITH 'hel'", '{subscribers} STARTS WITH {hel}'],
    ['subscribers NOT STARTS WITH hel', 'NOT ({subscribers} STARTS WITH {hel})'],
    ["subscribers CONTAINS 'hello'", '{subscribers} CONTAINS {hello}'],
  ])('presence, null, empty and string operators: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it.each([
    ['NOT NOT NOT NOT x = 5', '{x} = {5}'],
    ['NOT NOT (NOT NOT x = 5)', '{x} = {5}'],
    ['_geoRadius(12, 13, 14)', '_geoRadius({12}, {13}, {14})'],
    ['NOT _geoRadius(12, 13, 14)', 'NOT (_geoRadius({12}, {13}, {14}))'],
    ['_geoRadius(12,13,14)', '_geoRadius({12}, {13}, {14})'],
    ['_geoBoundingBox([12, 13], [14, 15])', '_geoBoundingBox([{12}, {13}], [{14}, {15}])'],
    ['NOT _geoBoundingBox([12, 13], [14, 15])', 'NOT (_geoBoundingBox([{12}, {13}], [{14}, {15}]))'],
    ['_geoBoundingBox([12,13],[14,15])', '_geoBoundingBox([{12}, {13}], [{14}, {15}])'],
  ])('double negation and geo operations: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it.each([
    ["channel = ponce AND 'dog race' != 'bernese mountain'", 'AND[{channel} = {ponce}, {dog race} != {bernese mountain}, ]'],
    ["channel = ponce OR 'dog race' != 'bernese mountain'", 'OR[{channel} = {ponce}, {dog race} != {bernese mountain}, ]'],
    [
      "channel = ponce AND 'dog race' != 'bernese mountain' OR subscribers > 1000",
      'OR[AND[{channel} = {ponce}, {dog race} != {bernese mountain}, ], {subscribers} > {1000}, ]',
    ],
    [
      "channel = ponce AND 'dog race' != 'bernese mountain' OR subscribers > 1000 OR colour = red OR colour = blue AND size = 7",
      'OR[AND[{channel} = {ponce}, {dog race} != {bernese mountain}, ], {subscribers} > {1000}, {colour} = {red}, AND[{colour} = {blue}, {size} = {7}, ], ]',
    ],
    [
      "channel = ponce AND ( 'dog race' != 'bernese mountain' OR subscribers > 1000 )",
      'AND[{channel} = {ponce}, OR[{dog race} != {bernese mountain}, {subscribers} > {1000}, ], ]',
    ],
    [
      "(channel = ponce AND 'dog race' != 'bernese mountain' OR subscribers > 1000) AND _geoRadius(12, 13, 14)",
      'AND[OR[AND[{channel} = {ponce}, {dog race} != {bernese mountain}, ], {subscribers} > {1000}, ], _geoRadius({12}, {13}, {14}), ]',
    ],
    ['NOT "OR" EXISTS AND "EXISTS" NOT EXISTS', 'AND[NOT ({OR} EXISTS), NOT ({EXISTS} EXISTS), ]'],
  ])('AND binds tighter than OR, parentheses group: %s', (filter, tree) => {
    expect(parsed(filter)).toBe(tree)
  })

  it('allows 49 nested parentheses, the most the engine accepts', () => {
    const filter = `${'('.repeat(49)}x = 1${')'.repeat(49)}`
    expect(parsed(filter)).toBe('{x} = {1}')
  })

  it('resolves escapes inside quoted values', () => {
    // snapshot `parse_escaped`: 'foo\\' is the value foo\ ; \x20 is a space, \" a double quote.
    expect(parsed("title = 'foo\\\\'")).toBe('{title} = {foo\\}')
    expect(parsed(`title = 'foo\\x20\\n\\t\\"\\'"'`)).toBe(`{title} = {foo \n\t"'"}`)
  })

  it('treats a blank filter as no filter', () => {
    expect(parseFilterString('   ')).toBeNull()
    expect(parseFilter([])).toBeNull()
    expect(parseFilter(null)).toBeNull()
  })
})

describe('filter parser: the array form', () => {
  // Meilisearch filter docs: outer array members are ANDed, inner arrays ORed.
  it('ANDs the outer members and ORs an inner array', () => {
    const node = parseFilter([['cone = 6', 'cone = 10'], 'atmosphere = reduction'])!
    expect(display(node)).toBe('AND[OR[{cone} = {6}, {cone} = {10}, ], {atmosphere} = {reduction}, ]')
  })

  it('keeps a single inner alternative as it is', () => {
    expect(display(parseFilter([['cone = 6'], 'kind = bisque'])!)).toBe('AND[{cone} = {6}, {kind} = {bisque}, ]')
  })

  it.each([
    [true, 'Invalid syntax for the filter parameter: `expected String, Array, found: true`.'],
    [[5], 'Invalid syntax for the filter parameter: `expected String, [String], found: 5`.'],
    [[['cone = 6', 7]], 'Invalid syntax for the filter parameter: `expected String, found: 7`.'],
  ])('rejects %j with the engine message', (filter, message) => {
    // message text: meilisearch tests/search/errors.rs `search_bad_filter` and
    // crates/meilisearch/src/search filter parsing (`invalid_filter_syntax_error`).
    expect(() => parseFilter(filter)).toThrow(new FilterSyntaxError(message))
  })
})

describe('filter parser: errors carry the engine wording and position', () => {
  it.each([
    [
      'channel = Ponce = 12',
      'Found unexpected characters at the end of the filter: `= 12`. You probably forgot an `OR` or an `AND` rule.\n17:21 channel = Ponce = 12',
    ],
    ['channel =    ', 'Was expecting a value but instead got nothing.\n14:14 channel =    '],
    ['channel = 🐻', 'Was expecting a value but instead got `🐻`.\n11:12 channel = 🐻'],
    ['channel = 🐻 AND followers < 100', 'Was expecting a value but instead got `🐻`.\n11:12 channel = 🐻 AND followers < 100'],
    ["'OR'", `${OPERATIONS} at \`\\'OR\\'\`.\n1:5 'OR'`],
    [
      'OR',
      'Was expecting a value but instead got `OR`, which is a reserved keyword. To use `OR` as a field name or a value, surround it by quotes.\n1:3 OR',
    ],
    ['channel Ponce', `${OPERATIONS} at \`channel Ponce\`.\n1:14 channel Ponce`],
    ['channel = Ponce OR', `${OPERATIONS} but instead got nothing.\n19:19 channel = Ponce OR`],
    ['_geoRadius', 'The `_geoRadius` filter expects three arguments: `_geoRadius(latitude, longitude, radius)`.\n1:11 _geoRadius'],
    [
      '_geoRadius = 12',
      'The `_geoRadius` filter expects three arguments: `_geoRadius(latitude, longitude, radius)`.\n1:16 _geoRadius = 12',
    ],
    [
      '_geoBoundingBox',
      'The `_geoBoundingBox` filter expects two pairs of arguments: `_geoBoundingBox([latitude, longitude], [latitude, longitude])`.\n1:16 _geoBoundingBox',
    ],
    [
      '_geoBoundingBox(1.0, 1.0)',
      'The `_geoBoundingBox` filter expects two pairs of arguments: `_geoBoundingBox([latitude, longitude], [latitude, longitude])`.\n1:26 _geoBoundingBox(1.0, 1.0)',
    ],
    [
      'position <= _geoRadius(12, 13, 14)',
      "The `_geoRadius` filter is an operation and can't be used as a value.\n13:35 position <= _geoRadius(12, 13, 14)",
    ],
    ["channel = 'ponce", "Expression `\\'ponce` is missing the following closing delimiter: `'`.\n11:17 channel = 'ponce"],
    ['channel = "ponce', 'Expression `\\"ponce` is missing the following closing delimiter: `"`.\n11:17 channel = "ponce'],
    [
      'channel = mv OR (followers >= 1000',
      'Expression `(followers >= 1000` is missing the following closing delimiter: `)`.\n17:35 channel = mv OR (followers >= 1000',
    ],
    [
      'channel = mv OR followers >= 1000)',
      'Found unexpected characters at the end of the filter: `)`. You probably forgot an `OR` or an `AND` rule.\n34:35 channel = mv OR followers >= 1000)',
    ],
    ['colour NOT EXIST', `${OPERATIONS} at \`colour NOT EXIST\`.\n1:17 colour NOT EXIST`],
    ['subscribers 100 TO1000', `${OPERATIONS} at \`subscribers 100 TO1000\`.\n1:23 subscribers 100 TO1000`],
    [
      "channel = ponce ORdog != 'bernese mountain'",
      "Found unexpected characters at the end of the filter: `ORdog != \\'bernese mountain\\'`. You probably forgot an `OR` or an `AND` rule.\n17:44 channel = ponce ORdog != 'bernese mountain'",
    ],
    ['colour IN blue, green]', 'Expected `[` after `IN` keyword.\n11:23 colour IN blue, green]'],
    [
      "colour IN [blue, green, 'blue' > 2]",
      "Expected only comma-separated field names inside `IN[..]` but instead found `> 2]`.\n32:36 colour IN [blue, green, 'blue' > 2]",
    ],
    [
      'colour IN [blue, green, AND]',
      'Expected only comma-separated field names inside `IN[..]` but instead found `AND]`.\n25:29 colour IN [blue, green, AND]',
    ],
    ['colour IN [blue, green', 'Expected matching `]` after the list of field names given to `IN[`\n23:23 colour IN [blue, green'],
    [
      "colour IN ['blue, green",
      "Expression `\\'blue, green` is missing the following closing delimiter: `'`.\n12:24 colour IN ['blue, green",
    ],
    [
      'x = EXISTS',
      'Was expecting a value but instead got `EXISTS`, which is a reserved keyword. To use `EXISTS` as a field name or a value, surround it by quotes.\n5:11 x = EXISTS',
    ],
    [
      'AND = 8',
      'Was expecting a value but instead got `AND`, which is a reserved keyword. To use `AND` as a field name or a value, surround it by quotes.\n1:4 AND = 8',
    ],
    [
      'NOT OR EXISTS AND EXISTS NOT EXISTS',
      'Was expecting a value but instead got `OR`, which is a reserved keyword. To use `OR` as a field name or a value, surround it by quotes.\n5:7 NOT OR EXISTS AND EXISTS NOT EXISTS',
    ],
    ['value NULL', `${OPERATIONS} at \`value NULL\`.\n1:11 value NULL`],
    ['value IS', `${OPERATIONS} at \`value IS\`.\n1:9 value IS`],
  ])('%s', (filter, message) => {
    expect(syntaxError(filter)).toBe(message)
  })

  it.each([
    ['_geoPoint(12, 13, 14)', '_geoPoint', '1:22'],
    ['position <= _geoPoint(12, 13, 14)', '_geoPoint', '13:34'],
    ['_geoDistance(12, 13, 14)', '_geoDistance', '1:25'],
    ['position <= _geoDistance(12, 13, 14)', '_geoDistance', '13:37'],
    ['_geo(12, 13, 14)', '_geo', '1:17'],
    ['position <= _geo(12, 13, 14)', '_geo', '13:29'],
  ])('refuses the reserved geo name in %s', (filter, name, position) => {
    expect(syntaxError(filter)).toBe(
      `\`${name}\` is a reserved keyword and thus can't be used as a filter expression. Use the \`_geoRadius(latitude, longitude, distance)\` or \`_geoBoundingBox([latitude, longitude], [latitude, longitude])\` built-in rules to filter on \`_geo\` coordinates.\n${position} ${filter}`,
    )
  })

  it('stops at 50 nested parentheses with the depth message', () => {
    const filter = `${'('.repeat(50)}x = 1${')'.repeat(50)}`
    expect(syntaxError(filter)).toBe(
      `The filter exceeded the maximum depth limit. Try rewriting the filter so that it contains fewer nested conditions.\n51:106 ${filter}`,
    )
  })
})

describe('filter parser: the fields a filter reads', () => {
  it('lists them in order, so the first non-filterable one is the one reported', () => {
    const node = parseFilterString('(cone = 6 OR NOT kind = bisque) AND _geoRadius(1, 2, 3) AND tags IN [gas]')!
    expect(filterFields(node).map((field) => field.value)).toEqual(['cone', 'kind', 'tags'])
  })

  it('keeps the span of each field for the position line', () => {
    const [field] = filterFields(parseFilterString('doggos.age > 2')!)
    // engine snapshot: "Attribute `doggos.age` is not filterable … \n1:11 doggos.age > 2"
    expect([field.start + 1, field.end + 1]).toEqual([1, 11])
  })
})
