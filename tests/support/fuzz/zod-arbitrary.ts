// fast-check arbitraries from zod 4 schemas: values shaped like what the schema accepts (so a good
// share of the generated bodies gets past validation and into the handlers), and hostile variants of
// them (wrong types, edge numbers, NUL and lone surrogates, huge and deeply nested values, prototype
// keys, missing and extra fields). Refinements cannot be generated; `examples` in a schema's metadata
// (`.meta({ examples })`) are used where a field only accepts a few words (cones, time zones).
import fc from 'fast-check'
import { z } from 'zod'

type Schema = z.ZodType
interface Def {
  type: string
  [key: string]: unknown
}
interface Check {
  check: string
  value?: number
  inclusive?: boolean
  minimum?: number
  maximum?: number
  length?: number
  format?: string
  pattern?: RegExp
}

const defOf = (schema: Schema) => (schema as unknown as { _zod: { def: Def } })._zod.def
const checksOf = (schema: Schema): Check[] =>
  ((defOf(schema).checks as { _zod: { def: Check } }[] | undefined) ?? []).map((c) => c._zod.def)

export interface GenerateOptions {
  /** Ids that exist (the fuzzer's own records, and other tenants' to try to reach). */
  ids: string[]
  /** Addresses that exist, mixed into generated e-mail fields. */
  emails: string[]
}

// Single UTF-16 code units (lone surrogates included) mixed with whole code points.
export const utf16Unit = fc.oneof(
  fc.nat(0xffff).map((unit) => String.fromCharCode(unit)),
  fc.integer({ min: 0xd800, max: 0xdfff }).map((unit) => String.fromCharCode(unit)),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 1 }),
)

const HOSTILE_STRINGS = [
  '',
  ' ',
  '\u0000',
  'a\u0000b',
  '\ud800',
  '\udfff',
  'x\udc00\ud800y',
  '\u202eevil',
  '\ufeff',
  '0',
  '-1',
  'NaN',
  'Infinity',
  'null',
  'undefined',
  'true',
  '__proto__',
  'constructor',
  "' OR 1=1 --",
  '"; DROP TABLE users; --',
  '<script>alert(1)</script>',
  '../../../../etc/passwd',
  '%00',
  '%s%n%x',
  '${7*7}',
  '\r\nBcc: victim@example.test',
  'Ａ\u0301\u0327\u0308',
]

/** Values of the wrong kind, at the edges, or built to hurt: swapped in anywhere in a body. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom<unknown>(...HOSTILE_STRINGS) },
  {
    weight: 3,
    arbitrary: fc.constantFrom<unknown>(
      null,
      true,
      false,
      0,
      -0,
      -1,
      0.5,
      1e308,
      -1e308,
      5e-324,
      2 ** 31,
      2 ** 53 + 2,
      -(2 ** 53) - 2,
      [],
      {},
      [null],
      [[[[[]]]]],
    ),
  },
  { weight: 2, arbitrary: fc.string({ unit: utf16Unit, maxLength: 30 }) },
  { weight: 1, arbitrary: fc.constantFrom('x'.repeat(100_000), '\u0000'.repeat(5000), '🏺'.repeat(20_000)) },
  // Deep nesting: a stack-hungry parser or a recursive walk would fall over.
  { weight: 1, arbitrary: fc.integer({ min: 200, max: 1000 }).map((depth) => JSON.parse('['.repeat(depth) + ']'.repeat(depth))) },
  { weight: 1, arbitrary: fc.integer({ min: 1000, max: 20_000 }).map((n) => Array.from({ length: n }, () => 0)) },
  // Keys that reach Object.prototype when a body is merged carelessly. JSON.parse makes them own keys.
  {
    weight: 2,
    arbitrary: fc.constantFrom(
      JSON.parse('{"__proto__": {"role": "admin", "isAdmin": true}}'),
      JSON.parse('{"constructor": {"prototype": {"role": "admin"}}}'),
      JSON.parse('{"__proto__": null, "toString": 1, "hasOwnProperty": 2}'),
    ),
  },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
)

function numberArbitrary(schema: Schema): fc.Arbitrary<number> {
  let min = -1e6
  let max = 1e6
  let minExcluded = false
  let maxExcluded = false
  let integer = false
  for (const c of checksOf(schema)) {
    if (c.check === 'greater_than') [min, minExcluded] = [c.value!, !c.inclusive]
    if (c.check === 'less_than') [max, maxExcluded] = [c.value!, !c.inclusive]
    if (c.check === 'number_format' && /int/.test(c.format ?? '')) integer = true
  }
  if (integer) return fc.integer({ min: Math.ceil(minExcluded ? min + 1 : min), max: Math.floor(maxExcluded ? max - 1 : max) })
  return fc.double({ min, max, minExcluded, maxExcluded, noNaN: true, noDefaultInfinity: true })
}

function stringArbitrary(schema: Schema, options: GenerateOptions): fc.Arbitrary<string> {
  const def = defOf(schema)
  const format = def.format as string | undefined
  if (format === 'uuid' || format === 'guid') return fc.oneof(fc.constantFrom(...options.ids), fc.uuid({ version: 4 }))
  if (format === 'email') return fc.oneof(fc.constantFrom(...options.emails), fc.emailAddress())
  if (format === 'datetime') {
    const day = 86_400_000
    return fc
      .integer({ min: -30, max: 120 })
      .chain((days) => fc.integer({ min: 0, max: day - 1 }).map((ms) => new Date(Date.now() + days * day + ms).toISOString()))
  }
  let minLength = 0
  let maxLength = 60
  let pattern: RegExp | null = null
  for (const c of checksOf(schema)) {
    if (c.check === 'min_length') minLength = c.minimum!
    if (c.check === 'max_length') maxLength = Math.min(c.maximum!, 60)
    if (c.check === 'length_equals') minLength = maxLength = c.length!
    if (c.check === 'string_format' && c.format === 'regex' && c.pattern) pattern = c.pattern
  }
  if (pattern) return fc.stringMatching(pattern)
  return fc.string({ minLength, maxLength: Math.max(minLength, maxLength) })
}

function examplesOf(schema: Schema): unknown[] {
  const examples = z.globalRegistry.get(schema)?.examples
  return Array.isArray(examples) ? examples : []
}

/** A value shaped like what `schema` accepts (refinements aside). */
export function arbitraryFor(schema: Schema, options: GenerateOptions): fc.Arbitrary<unknown> {
  // A schema that decides its shape in code names the shapes it accepts in its metadata.
  const shapes = z.globalRegistry.get(schema)?.oneOf
  if (Array.isArray(shapes)) return fc.oneof(...shapes.map((s: Schema) => arbitraryFor(s, options)))
  const examples = examplesOf(schema)
  const shaped = shapedArbitrary(schema, options)
  return examples.length ? fc.oneof({ weight: 3, arbitrary: fc.constantFrom(...examples) }, { weight: 1, arbitrary: shaped }) : shaped
}

function shapedArbitrary(schema: Schema, options: GenerateOptions): fc.Arbitrary<unknown> {
  const def = defOf(schema)
  const inner = (key: string) => arbitraryFor(def[key] as Schema, options)
  switch (def.type) {
    case 'string':
      return stringArbitrary(schema, options)
    case 'number':
      return def.coerce ? numberArbitrary(schema).map(String) : numberArbitrary(schema)
    case 'boolean':
      return fc.boolean()
    case 'literal':
      return fc.constantFrom(...(def.values as unknown[]))
    case 'enum':
      return fc.constantFrom(...Object.values(def.entries as Record<string, unknown>))
    case 'null':
      return fc.constant(null)
    case 'optional':
      return fc.option(inner('innerType'), { nil: undefined, freq: 3 })
    case 'nullable':
      return fc.option(inner('innerType'), { nil: null, freq: 4 })
    case 'default':
    case 'prefault':
    case 'catch':
    case 'readonly':
    case 'nonoptional':
      return inner('innerType')
    case 'pipe': {
      // The input side decides what is accepted; a formatted output (an e-mail after trimming) is more specific.
      const out = def.out as Schema
      const outDef = defOf(out)
      if (outDef.type === 'string' && outDef.format) return arbitraryFor(out, options)
      return inner('in')
    }
    case 'object': {
      const shape = def.shape as Record<string, Schema>
      const required = Object.keys(shape).filter((k) => !['optional', 'default', 'prefault'].includes(defOf(shape[k]).type))
      const fields = Object.fromEntries(Object.entries(shape).map(([k, s]) => [k, arbitraryFor(s, options)]))
      return fc.record(fields, { requiredKeys: required }).map((value) => dropUndefined(value as Record<string, unknown>))
    }
    case 'array': {
      const checks = checksOf(schema)
      const minLength = checks.find((c) => c.check === 'min_length')?.minimum ?? 0
      const maxLength = Math.min(checks.find((c) => c.check === 'max_length')?.maximum ?? 4, Math.max(minLength, 4))
      return fc.array(inner('element'), { minLength, maxLength })
    }
    case 'tuple':
      return fc.tuple(...(def.items as Schema[]).map((s) => arbitraryFor(s, options)))
    case 'union':
      return fc.oneof(...(def.options as Schema[]).map((s) => arbitraryFor(s, options)))
    case 'intersection':
      return fc.tuple(inner('left'), inner('right')).map(([a, b]) => ({ ...(a as object), ...(b as object) }))
    case 'record':
      return fc.dictionary(arbitraryFor(def.keyType as Schema, options) as fc.Arbitrary<string>, inner('valueType'), { maxKeys: 4 })
    case 'lazy':
      return arbitraryFor((def.getter as () => Schema)(), options)
    default:
      // unknown, any, transform, custom: anything JSON can carry.
      return fc.jsonValue({ maxDepth: 2 })
  }
}

function dropUndefined(value: Record<string, unknown>) {
  for (const key of Object.keys(value)) if (value[key] === undefined) delete value[key]
  return value
}

/** Every path to a value inside `value` (the root is []). */
function pathsOf(value: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix)
  if (Array.isArray(value)) value.forEach((v, i) => pathsOf(v, [...prefix, i], out))
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) pathsOf(v, [...prefix, k], out)
  return out
}

function setAt(root: unknown, path: (string | number)[], replace: (old: unknown) => unknown | typeof REMOVE): unknown {
  if (!path.length) {
    const next = replace(root)
    return next === REMOVE ? undefined : next
  }
  const copy = structuredClone(root) as Record<string | number, unknown>
  let node = copy
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>
  const last = path[path.length - 1]
  const next = replace(node[last])
  if (next === REMOVE) {
    if (Array.isArray(node)) node.splice(last as number, 1)
    else delete node[last]
  } else {
    // defineProperty, so a key named __proto__ becomes an own key rather than a prototype change.
    Object.defineProperty(node, last, { value: next, enumerable: true, writable: true, configurable: true })
  }
  return copy
}

const REMOVE = Symbol('remove')

type Mutation = (old: unknown) => unknown | typeof REMOVE

/** The ways one spot in a body is broken. */
const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  {
    weight: 5,
    arbitrary: hostileValue.map(
      (v): Mutation =>
        () =>
          v,
    ),
  },
  {
    weight: 3,
    // A poison character inside otherwise good text.
    arbitrary: fc.tuple(fc.constantFrom('\u0000', '\ud800', '\udfff', '\u0000\u0000', '\udbff\u0000'), fc.nat()).map(
      ([poison, at]): Mutation =>
        (old) =>
          typeof old === 'string' ? old.slice(0, at % (old.length + 1)) + poison + old.slice(at % (old.length + 1)) : poison,
    ),
  },
  { weight: 2, arbitrary: fc.constant<Mutation>(() => REMOVE) },
  // The same value one step off: a string where a number was, a number where text was, wrapped in an array.
  {
    weight: 2,
    arbitrary: fc.constantFrom<Mutation>(
      (old) => (typeof old === 'number' ? String(old) : typeof old === 'string' ? Number(old) || old.length : [old]),
      (old) => [old],
      (old) => ({ value: old }),
      (old) => (typeof old === 'number' ? -old * 1e6 : old),
    ),
  },
  {
    weight: 2,
    arbitrary: fc
      .tuple(
        fc.constantFrom('__proto__', 'constructor', 'prototype', 'id', 'role', 'studioId', 'userId', 'amountCents', 'state'),
        hostileValue,
      )
      .map(([key, value]): Mutation => (old) => {
        if (!old || typeof old !== 'object' || Array.isArray(old)) return old
        const copy = { ...(old as object) }
        Object.defineProperty(copy, key, { value, enumerable: true, writable: true, configurable: true })
        return copy
      }),
  },
)

/** A body shaped by the schema with one to three spots broken. */
export function mutatedArbitrary(schema: Schema, options: GenerateOptions): fc.Arbitrary<unknown> {
  return fc
    .tuple(arbitraryFor(schema, options), fc.array(fc.tuple(fc.nat(), mutation), { minLength: 1, maxLength: 3 }))
    .map(([body, mutations]) =>
      mutations.reduce((value, [at, mutate]) => {
        const paths = pathsOf(value)
        return setAt(value, paths[at % paths.length], mutate)
      }, body),
    )
}

/** What the fuzzer sends a route with a body: mostly well-shaped, many broken, some wholly hostile. */
export function bodyArbitrary(schema: Schema | null, options: GenerateOptions): fc.Arbitrary<unknown> {
  if (!schema) return fc.oneof(hostileValue, fc.jsonValue({ maxDepth: 3 }))
  return fc.oneof(
    { weight: 3, arbitrary: arbitraryFor(schema, options) },
    { weight: 6, arbitrary: mutatedArbitrary(schema, options) },
    { weight: 1, arbitrary: hostileValue },
  )
}
