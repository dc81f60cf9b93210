// The fuzz suite: every route the app has (found by walking its router, so a route added tomorrow is
// covered without editing this file), sent bodies generated from the route's own zod schema and
// broken with fast-check, raw bodies no parser should choke on, hostile query strings and hostile
// path ids. It passes when no answer is a 5xx, no input reached the database unvalidated, and no row
// of the other tenant changed.
//
// FUZZ_RUNS (bodies per write route, default 100), FUZZ_QUERY_RUNS (queries per read route, default
// 30) and FUZZ_SEED make a longer or different run: `FUZZ_RUNS=2000 FUZZ_SEED=7 npx vitest run tests/integration/fuzz.test.ts`.
import fc from 'fast-check'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Logger } from '../../server/context'
import { StudioMember } from '../../server/entities/StudioMember'
import { appRoutes, type AppRoute } from '../support/fuzz/routes'
import { bodyArbitrary, hostileValue, utf16Unit, type GenerateOptions } from '../support/fuzz/zod-arbitrary'
import { HttpSession, type Reply } from '../support/http-client'
import { createPerson, PERSON_PASSWORD, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

const RUNS = Number(process.env.FUZZ_RUNS ?? 100)
const QUERY_RUNS = Number(process.env.FUZZ_QUERY_RUNS ?? 30)
const SEED = Number(process.env.FUZZ_SEED ?? 20_261_201)
const CONCURRENCY = 6

interface Tenant {
  owner: Person
  crew: Person
  potter: Person
  studioId: string
  kilnId: string
  firingId: string
  requestId: string
  photoId: string
  inviteId: string
  memberId: string
}

let app: TestApp
let a: Tenant
let b: Tenant
let admin: Person
let victim: Person
let anonymous: HttpSession
const logged: string[] = []
const recordingLog: Logger = {
  info() {},
  warn: (message) => logged.push(`warn: ${message}`),
  error: (message, error) => logged.push(`error: ${message} ${(error as Error)?.stack ?? ''}`),
}

async function tinyJpeg() {
  return sharp({ create: { width: 24, height: 16, channels: 3, background: { r: 120, g: 60, b: 30 } } })
    .jpeg()
    .toBuffer()
}

async function uploadPhoto(session: HttpSession, requestId: string, kind: string) {
  const form = new FormData()
  form.append('kind', kind)
  form.append('photos', new Blob([new Uint8Array(await tinyJpeg())], { type: 'image/jpeg' }), 'ware.jpg')
  const reply = await session.request('POST', `/api/requests/${requestId}/photos`, undefined, { raw: form })
  if (reply.status !== 201) throw new Error(`photo: ${reply.status} ${JSON.stringify(reply.body)}`)
  return reply.body.photos[0].id as string
}

async function tenant(name: string): Promise<Tenant> {
  const owner = await createPerson(app, 'host', `${name} Owner`)
  const crew = await createPerson(app, 'crew', `${name} Crew`)
  const potter = await createPerson(app, 'potter', `${name} Potter`)
  const ids = await publishedStudio(owner.session, `${name} Pottery`)
  const member = await app.ctx.db.getRepository(StudioMember).save({ studioId: ids.studioId, userId: crew.id, role: 'crew' })
  const requestId = (await draftAndSend(potter.session, ids.firingId, [mug()])).id
  const photoId = await uploadPhoto(potter.session, requestId, 'ware')
  const invited = await owner.session.post(`/api/studios/${ids.studioId}/invites`, { email: `invited.${name.toLowerCase()}@example.test` })
  if (invited.status !== 202) throw new Error(`invite: ${invited.status}`)
  const crewList = await owner.session.get(`/api/studios/${ids.studioId}/crew`)
  return { owner, crew, potter, ...ids, requestId, photoId, inviteId: crewList.body.invites[0].id, memberId: member.id }
}

const idsOf = (t: Tenant) => [
  t.studioId,
  t.kilnId,
  t.firingId,
  t.requestId,
  t.photoId,
  t.inviteId,
  t.memberId,
  t.owner.id,
  t.crew.id,
  t.potter.id,
]

/** A tenant's record for an id param, by the word before it in the path. */
function idFor(t: Tenant, route: AppRoute, param: string): string[] {
  const before = route.path.split('/').at(route.path.split('/').indexOf(`:${param}`) - 1)
  const byWord: Record<string, string> = {
    studios: t.studioId,
    kilns: t.kilnId,
    firings: t.firingId,
    requests: t.requestId,
    photos: t.photoId,
    users: t === a ? victim.id : t.potter.id,
    invites: t.inviteId,
    crew: t.memberId,
  }
  if (!/(^id$|Id$)/.test(param)) return ['accept', 'refuse', 'other']
  // A resource this file has never heard of: try each of the tenant's records until one is found.
  return before && byWord[before] ? [byWord[before]] : idsOf(t)
}

const fill = (path: string, values: Record<string, string>) => path.replace(/:(\w+)/g, (_, name: string) => values[name])

// ---------------------------------------------------------------------------------------------------
// Sending

interface Outcome {
  route: string
  what: string
  status: number
  body: unknown
}
const failures: Outcome[] = []
const counts = new Map<string, Map<number, number>>()

function record(route: AppRoute, what: string, reply: Reply) {
  const key = `${route.method} ${route.path}`
  const byStatus = counts.get(key) ?? new Map<number, number>()
  byStatus.set(reply.status, (byStatus.get(reply.status) ?? 0) + 1)
  counts.set(key, byStatus)
  if (reply.status >= 500) failures.push({ route: key, what: what.slice(0, 400), status: reply.status, body: reply.body })
}

const describeBody = (body: unknown) => {
  try {
    return JSON.stringify(body)?.slice(0, 300) ?? String(body)
  } catch {
    return String(body)
  }
}

async function inPool<T>(items: T[], work: (item: T) => Promise<void>) {
  let next = 0
  await Promise.all(
    Array.from({ length: CONCURRENCY }, async () => {
      while (next < items.length) await work(items[next++])
    }),
  )
}

/** A JSON body, sent as the bytes JSON.stringify makes (lone surrogates escaped, as a browser would). */
function sendJson(session: HttpSession, route: AppRoute, path: string, body: unknown) {
  return session.request(route.method, path, undefined, {
    raw: body === undefined ? '' : JSON.stringify(body),
    headers: { 'Content-Type': 'application/json' },
  })
}

/** Bodies no JSON parser should fall over on. */
function rawBodies(sample: unknown): { raw: string | Uint8Array<ArrayBuffer>; type: string }[] {
  const json = JSON.stringify(sample ?? {})
  return [
    { raw: json.slice(0, Math.max(1, json.length >> 1)), type: 'application/json' },
    { raw: '', type: 'application/json' },
    { raw: 'null', type: 'application/json' },
    { raw: '"just a string"', type: 'application/json' },
    { raw: '{"a":1}{"b":2}', type: 'application/json' },
    { raw: '\ufeff' + json, type: 'application/json' },
    { raw: '1' + '0'.repeat(400), type: 'application/json' },
    { raw: json, type: 'application/json; charset=latin1' },
    { raw: json, type: 'text/plain' },
    { raw: 'a[b][c]=1&__proto__[x]=1&a=%00', type: 'application/x-www-form-urlencoded' },
    { raw: new Uint8Array([0x7b, 0x22, 0xff, 0xfe, 0x22, 0x3a, 0x31, 0x7d]), type: 'application/json' },
    { raw: '--b\r\nContent-Disposition: form-data; name="x"\r\n\r\n1\r\n--b--\r\n', type: 'multipart/form-data; boundary=b' },
  ]
}

async function multipartBodies(route: AppRoute, options: GenerateOptions, runs: number) {
  const jpeg = await tinyJpeg()
  const field = route.multipart!.fileField ?? 'file'
  const fileName = fc.oneof(
    fc.constantFrom('ware.jpg', '../../../etc/passwd', 'a\u0000.jpg', '\ud800.png', '', 'x'.repeat(3000), 'CON', '.htaccess'),
    fc.string({ unit: utf16Unit, maxLength: 40 }),
  )
  const fileBytes = fc.oneof(
    fc.constant(jpeg),
    fc.uint8Array({ maxLength: 2000 }).map((bytes) => Buffer.from(bytes)),
    fc.nat(jpeg.length).map((cut) => jpeg.subarray(0, cut)),
    fc.constant(Buffer.from('<?php system($_GET[1]); ?>')),
  )
  const fieldsArb = bodyArbitrary(route.multipart!.schema, options)
  const formArb = fc.record({
    fields: fieldsArb,
    files: fc.array(fc.record({ name: fileName, bytes: fileBytes, field: fc.oneof(fc.constant(field), fc.constant('other')) }), {
      maxLength: 10,
    }),
  })
  return fc.sample(formArb, { numRuns: runs, seed: SEED }).map(({ fields, files }) => {
    const form = new FormData()
    if (fields && typeof fields === 'object' && !Array.isArray(fields)) {
      for (const [k, v] of Object.entries(fields)) form.append(k, typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))
    } else form.append('kind', describeBody(fields))
    for (const f of files) form.append(f.field, new Blob([new Uint8Array(f.bytes)], { type: 'image/jpeg' }), f.name)
    return {
      form,
      what: `fields ${describeBody(fields)}, files ${files.map((f) => `${JSON.stringify(f.name)}:${f.bytes.length}`).join(',')}`,
    }
  })
}

// ---------------------------------------------------------------------------------------------------
// Choosing who calls a route, with which ids

interface Plan {
  route: AppRoute
  as: string
  session: HttpSession
  params: Record<string, string>
  sample: unknown
}

function identities(): [string, HttpSession][] {
  return [
    ['owner', a.owner.session],
    ['potter', a.potter.session],
    ['crew', a.crew.session],
    ['admin', admin.session],
    ['anonymous', anonymous],
  ]
}

const sampleBody = (route: AppRoute, options: GenerateOptions) => {
  const schema = route.body?.schema ?? null
  if (!schema) return undefined
  return fc.sample(bodyArbitrary(schema, options), { numRuns: 1, seed: SEED })[0]
}

/** The first caller and ids that get past the route's guard (a 2xx preferred), so bodies reach validation. */
async function planFor(route: AppRoute, options: GenerateOptions): Promise<Plan> {
  const sample = sampleBody(route, options)
  const combos = route.params.reduce<Record<string, string>[]>(
    (acc, p) => acc.flatMap((values) => idFor(a, route, p).map((id) => ({ ...values, [p]: id }))),
    [{}],
  )
  let fallback: Plan | null = null
  for (const [as, session] of identities()) {
    for (const params of combos.slice(0, 12)) {
      const reply =
        route.method === 'GET'
          ? await session.get(fill(route.path, params))
          : await sendJson(session, route, fill(route.path, params), sample)
      record(route, `plan as ${as}`, reply)
      if ([401, 403, 404, 429].includes(reply.status)) continue
      const plan = { route, as, session, params, sample }
      if (reply.status < 300) return plan
      fallback ??= plan
    }
  }
  return fallback ?? { route, as: 'owner', session: a.owner.session, params: combos[0], sample }
}

/** Routes that end things run last, so the others still find records to work on. */
function order(route: AppRoute) {
  if (route.method === 'GET') return 0
  if (/logout|cancel|withdraw|decline|suspend|refund|collected|dispute/.test(route.path)) return 2
  if (route.method === 'DELETE') return 3
  return 1
}

/** A route may have signed the session out, or into an account it just made: sign the person in again. */
async function stillSignedIn(person: Person) {
  const me = await person.session.get('/api/auth/me')
  if (me.status === 200 && me.body.id === person.id) return
  person.session.cookies.clear()
  person.session.csrfToken = null
  await person.session.signIn(person.email, PERSON_PASSWORD)
}

// ---------------------------------------------------------------------------------------------------
// The other tenant's rows

async function otherTenantRows(): Promise<string[]> {
  const ids = idsOf(b)
  const pattern = ids.join('|')
  const tables: { table_name: string }[] = await app.ctx.db.query(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE'
       AND table_name NOT IN ('session', 'rate_limit_counters', 'typeorm_migrations') ORDER BY table_name`,
  )
  const rows: string[] = []
  for (const { table_name } of tables) {
    // A row is the other tenant's when it names one of their records; a request of ours to their
    // firing names their firing only through firing_id, and may be made.
    const found: { row: string }[] = await app.ctx.db.query(
      `SELECT (to_jsonb(t) - 'firing_id' - 'proposed_firing_id')::text AS row FROM "${table_name}" t
       WHERE (to_jsonb(t) - 'firing_id' - 'proposed_firing_id')::text ~ $1 ORDER BY 1`,
      [pattern],
    )
    rows.push(...found.map((r) => `${table_name}: ${r.row}`))
  }
  return rows
}

// ---------------------------------------------------------------------------------------------------

let routes: AppRoute[]
let options: GenerateOptions
let before: string[]

beforeAll(async () => {
  app = await startTestApp({
    worker: false,
    stripe: true,
    log: recordingLog,
    config: {
      rateLimits: { authPerIpPer15Min: 1_000_000, authPerAccountPer15Min: 1_000_000, openApiPerIpPerMin: 1_000_000 },
    },
  })
  a = await tenant('Alder')
  b = await tenant('Birch')
  admin = await createPerson(app, 'admin', 'Fuzz Desk')
  victim = await createPerson(app, 'potter', 'Fuzz Victim')
  anonymous = new HttpSession(app.url)
  routes = appRoutes(app.express).sort((x, y) => order(x) - order(y))
  options = {
    ids: [...idsOf(a), ...idsOf(b)],
    emails: [a.owner.email, a.potter.email, victim.email, 'new.person@example.test'],
  }
  before = await otherTenantRows()
}, 120_000)

afterAll(async () => {
  await app?.close()
})

const HOSTILE_IDS = [
  'not-a-uuid',
  '%00',
  '-1',
  "1'%20OR%20'1'='1",
  '%ED%A0%80',
  '%FF%FE',
  'x'.repeat(3000),
  '00000000-0000-0000-0000-000000000000',
  'FFFFFFFF-FFFF-4FFF-BFFF-FFFFFFFFFFFF',
  '6f1c2a9e-3b7d-4c1a-9e2f-8a7b6c5d4e3f%00',
  '..%2F..%2Fetc%2Fpasswd',
  '__proto__',
]

const HOSTILE_QUERY_VALUES = [
  '%00',
  '%ED%A0%80',
  '%FF',
  '%',
  '%%',
  '%E0%A4%A',
  '-1',
  '1e999',
  'NaN',
  '0x10',
  '%20',
  'x'.repeat(5000),
  '..',
  '__proto__',
]

/** Percent-encoding that also writes a lone surrogate, as the three bytes a careless encoder would send. */
function percentEncode(value: string) {
  let out = ''
  for (const ch of value) {
    const unit = ch.charCodeAt(0)
    out +=
      ch.length === 1 && unit >= 0xd800 && unit <= 0xdfff
        ? [0xe0 | (unit >> 12), 0x80 | ((unit >> 6) & 0x3f), 0x80 | (unit & 0x3f)]
            .map((byte) => `%${byte.toString(16).toUpperCase()}`)
            .join('')
        : encodeURIComponent(ch)
  }
  return out
}

/** Query strings built to hurt: hostile values for the route's own keys and common ones, arrays, nesting, prototype keys. */
function hostileQueries(route: AppRoute, runs: number): string[] {
  const shape = (route.query?.schema as unknown as { shape?: Record<string, unknown> } | undefined)?.shape ?? {}
  const keys = [...new Set([...Object.keys(shape), 'q', 'page', 'id', 'mine', 'all', 'from', 'to'])]
  const encode = (v: unknown) => percentEncode(typeof v === 'string' ? v : describeBody(v))
  const pair = fc.oneof(
    fc.tuple(fc.constantFrom(...keys), fc.constantFrom(...HOSTILE_QUERY_VALUES)).map(([k, v]) => `${k}=${v}`),
    fc.tuple(fc.constantFrom(...keys), hostileValue).map(([k, v]) => `${k}=${encode(v)}`),
    fc.tuple(fc.constantFrom(...keys), fc.string({ unit: utf16Unit, maxLength: 20 })).map(([k, v]) => `${k}=${encode(v)}`),
    fc.constantFrom(...keys).map((k) => `${k}=a&${k}=b`),
    fc.constantFrom(...keys).map((k) => `${k}[]=x&${k}[a][b]=1`),
    fc.constantFrom('__proto__[x]=1', 'constructor[prototype][role]=admin', '%00=1', '=', '&&&', 'a=%00&b=%ud800'),
  )
  return fc.sample(fc.array(pair, { minLength: 1, maxLength: 4 }), { numRuns: runs, seed: SEED }).map((pairs) => pairs.join('&'))
}

describe('the fuzz suite', () => {
  it('finds the routes by walking the router, with the schema each one validates against', () => {
    expect(routes.length).toBeGreaterThanOrEqual(70)
    const photos = routes.find((r) => r.method === 'POST' && r.path === '/api/requests/:id/photos')
    expect(photos?.multipart?.fileField).toBe('photos')
    expect(routes.find((r) => r.method === 'GET' && r.path === '/api/search')?.query).not.toBeNull()
    expect(routes.find((r) => r.method === 'POST' && r.path === '/api/requests/:id/messages')?.body).not.toBeNull()
  })

  // The time limit is a safety net for a hung run: about 11,000 requests take ten minutes on a busy two-core machine.
  it(`answers ${RUNS} generated bodies per write route, and hostile queries and ids on every route, without a 5xx`, async () => {
    const summary: string[] = []
    for (const route of routes) {
      for (const person of [a.owner, a.potter, a.crew, admin]) await stillSignedIn(person)
      const started = Date.now()
      const plan = await planFor(route, options)
      const path = fill(route.path, plan.params)
      let sent = 0

      if (route.method !== 'GET') {
        if (route.multipart) {
          await inPool(await multipartBodies(route, options, RUNS), async ({ form, what }) => {
            record(route, what, await plan.session.request('POST', path, undefined, { raw: form }))
            sent++
          })
        } else {
          const bodies = fc.sample(bodyArbitrary(route.body?.schema ?? null, options), { numRuns: RUNS, seed: SEED })
          await inPool(bodies, async (body) => {
            record(route, describeBody(body), await sendJson(plan.session, route, path, body))
            sent++
          })
        }
        for (const { raw, type } of rawBodies(plan.sample)) {
          const reply = await plan.session.request(route.method, path, undefined, { raw, headers: { 'Content-Type': type } })
          record(route, `raw ${type}: ${String(raw).slice(0, 80)}`, reply)
          sent++
        }
      }

      const queries = hostileQueries(route, route.method === 'GET' ? QUERY_RUNS : 2)
      await inPool(queries, async (query) => {
        const reply = await plan.session.request(route.method, `${path}?${query}`, route.method === 'GET' ? undefined : plan.sample)
        record(route, `?${query}`, reply)
        sent++
      })

      // Hostile ids, and the other tenant's ids (not for an admin, who may act on anyone's records).
      for (const param of route.params) {
        const theirs = plan.as === 'admin' ? [] : idFor(b, route, param)
        await inPool([...HOSTILE_IDS, ...theirs], async (id) => {
          const hostilePath = fill(route.path, { ...plan.params, [param]: id })
          const reply =
            route.method === 'GET'
              ? await plan.session.get(hostilePath)
              : await plan.session.request(route.method, hostilePath, plan.sample, route.multipart ? { raw: new FormData() } : {})
          record(route, `${param}=${id.slice(0, 60)}`, reply)
          sent++
        })
      }
      const statuses = [...(counts.get(`${route.method} ${route.path}`) ?? new Map())].map(([s, n]) => `${s}×${n}`).join(' ')
      const line = `${route.method.padEnd(6)} ${route.path.padEnd(42)} as ${plan.as.padEnd(9)} ${String(sent).padStart(4)} sent ${String(Date.now() - started).padStart(6)} ms  ${statuses}`
      // Printed as each route finishes too, so a slow or stuck route shows itself while the run goes on.
      console.log(`fuzz: ${line}`)
      summary.push(line)
      if (route.method !== 'GET') expect(sent, `${route.method} ${route.path}`).toBeGreaterThanOrEqual(RUNS)
    }
    console.log(`fuzz seed ${SEED}, ${RUNS} bodies per write route, ${QUERY_RUNS} queries per read route\n${summary.join('\n')}`)
    expect(
      failures.slice(0, 10).map((f) => `${f.status} ${f.route} ${f.what} -> ${describeBody(f.body)}`),
      `${failures.length} answers were 5xx`,
    ).toEqual([])
  }, 1_800_000)

  it('let no input reach the database unvalidated', () => {
    expect(logged.filter((line) => /unvalidated|unhandled|unchecked/.test(line)).slice(0, 5)).toEqual([])
  })

  it('changed no row of the other tenant', async () => {
    expect(before.length).toBeGreaterThan(10)
    const after = await otherTenantRows()
    expect({ added: after.filter((row) => !before.includes(row)), removed: before.filter((row) => !after.includes(row)) }).toEqual({
      added: [],
      removed: [],
    })
  })
})
