// npm run seed:bench -- --studios 5000 --firings 20000 [--reset]
// Bench data: invented published studios scattered over the Pacific Northwest, each with one kiln and
// a price list, and firings spread over the next eight weeks. Written straight to the tables in
// batches; the search index is rebuilt from them when the server starts.
import { randomUUID } from 'node:crypto'
import { parseArgs } from 'node:util'
import { DEFAULT_POLICIES } from '../../shared/schemas/studios'
import { hashPassword } from '../auth/password'
import { withDatabase } from './local-database'

const { values } = parseArgs({
  options: {
    studios: { type: 'string', default: '5000' },
    firings: { type: 'string', default: '20000' },
    reset: { type: 'boolean', default: false },
  },
})
const studioCount = Number(values.studios)
const firingCount = Number(values.firings)
if (!Number.isInteger(studioCount) || studioCount < 1 || !Number.isInteger(firingCount) || firingCount < 0) {
  console.error('usage: npm run seed:bench -- --studios 5000 --firings 20000 [--reset]')
  process.exit(2)
}

// A fixed-seed generator, so two runs make the same data.
let seed = 20261201
const random = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648
const pick = <T>(items: readonly T[]) => items[Math.floor(random() * items.length)]
const BENCH_PREFIX = 'Bench studio'

await withDatabase(async (db) => {
  const [{ existing }] = await db.query(`SELECT count(*)::int AS existing FROM studios WHERE name LIKE $1`, [`${BENCH_PREFIX} %`])
  if (existing && !values.reset) {
    console.log(`${existing} bench studios are already there; add --reset to replace them.`)
    return
  }
  if (existing) {
    console.log(`removing ${existing} earlier bench studios`)
    await db.query(
      `DELETE FROM firings WHERE kiln_id IN (SELECT k.id FROM kilns k JOIN studios s ON s.id = k.studio_id WHERE s.name LIKE $1)`,
      [`${BENCH_PREFIX} %`],
    )
    await db.query(`DELETE FROM studios WHERE name LIKE $1`, [`${BENCH_PREFIX} %`])
  }
  const ownerEmail = 'bench.owner@demo.conewright.test'
  const [owner] = await db.query(
    `INSERT INTO users (email, password_hash, display_name, role, email_verified_at) VALUES ($1, $2, 'Bench Studio Owner', 'host', now())
     ON CONFLICT (email) DO UPDATE SET display_name = EXCLUDED.display_name RETURNING id`,
    [ownerEmail, await hashPassword('bench-owner-password-unused')],
  )
  const started = Date.now()
  const kilnIds: string[] = []
  const BATCH = 500
  for (let start = 0; start < studioCount; start += BATCH) {
    const studios: unknown[][] = []
    const kilns: unknown[][] = []
    for (let i = start; i < Math.min(studioCount, start + BATCH); i++) {
      const studioId = randomUUID()
      const kilnId = randomUUID()
      kilnIds.push(kilnId)
      // Around Portland, Oregon: ±3° latitude, ±4° longitude.
      studios.push([studioId, `${BENCH_PREFIX} ${i + 1}`, 45.5 + (random() - 0.5) * 6, -122.7 + (random() - 0.5) * 8])
      const gas = random() < 0.3
      const diameter = 400 + Math.floor(random() * 500)
      kilns.push([
        kilnId,
        studioId,
        gas ? 'gas' : 'electric',
        gas ? ['reduction', 'oxidation'] : ['oxidation'],
        gas ? 'box' : 'round',
        gas ? null : diameter,
        gas ? diameter + 200 : null,
        gas ? diameter : null,
        450 + Math.floor(random() * 600),
        gas ? '010' : '022',
        gas ? '12' : '10',
      ])
    }
    await db.query(
      `INSERT INTO studios (id, name, lat, lng, timezone, policies, published, verified_at, city, region)
       SELECT s.id::uuid, s.name, s.lat::float8, s.lng::float8, 'America/Los_Angeles', $2::jsonb, true, now(), 'Benchville', 'OR'
       FROM jsonb_to_recordset($1::jsonb) AS s(id text, name text, lat float8, lng float8)`,
      [JSON.stringify(studios.map(([id, name, lat, lng]) => ({ id, name, lat, lng }))), JSON.stringify(DEFAULT_POLICIES)],
    )
    await db.query(`INSERT INTO studio_members (studio_id, user_id, role) SELECT id, $2, 'owner' FROM unnest($1::uuid[]) AS id`, [
      studios.map((s) => s[0]),
      owner.id,
    ])
    await db.query(
      `INSERT INTO kilns (id, studio_id, name, kind, atmospheres, interior_shape, diameter_mm, width_mm, depth_mm, height_mm, min_cone, max_cone, max_temp_c, max_ramp_c_per_hour, preheat_hold, controlled_cooling, shelf_count)
       SELECT k.id::uuid, k.studio_id::uuid, 'Bench kiln', k.kind, k.atmospheres, k.shape, k.diameter, k.width, k.depth, k.height, k.min_cone, k.max_cone, 1320, 250, true, false, 5
       FROM jsonb_to_recordset($1::jsonb) AS k(id text, studio_id text, kind text, atmospheres text[], shape text, diameter float8, width float8, depth float8, height float8, min_cone text, max_cone text)`,
      [
        JSON.stringify(
          kilns.map(([id, studio_id, kind, atmospheres, shape, diameter, width, depth, height, min_cone, max_cone]) => ({
            id,
            studio_id,
            kind,
            atmospheres,
            shape,
            diameter,
            width,
            depth,
            height,
            min_cone,
            max_cone,
          })),
        ),
      ],
    )
    await db.query(
      `INSERT INTO kiln_price_lists (kiln_id, currency, model, cents_per_cubic_inch, minimum_per_piece_cents, deposit_percent)
       SELECT id, 'USD', 'volume', 3 + (random() * 3)::int, 250, 25 FROM unnest($1::uuid[]) AS id`,
      [kilns.map((k) => k[0])],
    )
    process.stdout.write(`\r  studios ${Math.min(studioCount, start + BATCH)}/${studioCount}`)
  }
  process.stdout.write('\n')
  const CONES = ['04', '06', '5', '6', '6', '6', '10', '10']
  for (let start = 0; start < firingCount; start += 2000) {
    const rows = []
    for (let i = start; i < Math.min(firingCount, start + 2000); i++) {
      const dropOff = Date.now() + (1 + random() * 55) * 86400_000
      const cone = pick(CONES)
      rows.push({
        kiln_id: kilnIds[i % kilnIds.length],
        kind: cone.startsWith('0') ? 'bisque' : 'glaze',
        cone,
        drop_off_by: new Date(dropOff).toISOString(),
        firing_date: new Date(dropOff + 2 * 86400_000).toISOString(),
        ready_by: new Date(dropOff + 4 * 86400_000).toISOString(),
        // Some firings offer part of the kiln; the rest offer every layer (null).
        layers_on_sale: random() < 0.5 ? 1 + Math.floor(random() * 4) : null,
      })
    }
    // Oxidation everywhere; the gas kilns also fire cone 10 in reduction.
    await db.query(
      `INSERT INTO firings (kiln_id, kind, cone, atmosphere, drop_off_by, firing_date, ready_by, layers_on_sale)
       SELECT f.kiln_id::uuid, f.kind, f.cone, CASE WHEN k.kind = 'gas' AND f.cone = '10' THEN 'reduction' ELSE 'oxidation' END,
              f.drop_off_by::timestamptz, f.firing_date::timestamptz, f.ready_by::timestamptz, f.layers_on_sale
       FROM jsonb_to_recordset($1::jsonb) AS f(kiln_id text, kind text, cone text, drop_off_by text, firing_date text, ready_by text, layers_on_sale integer)
       JOIN kilns k ON k.id = f.kiln_id::uuid`,
      [JSON.stringify(rows)],
    )
    process.stdout.write(`\r  firings ${Math.min(firingCount, start + 2000)}/${firingCount}`)
  }
  process.stdout.write('\n')
  console.log(
    `Seeded ${studioCount} studios and ${firingCount} firings in ${((Date.now() - started) / 1000).toFixed(1)} s. The search index is rebuilt when the server starts, or with npm run search:reindex.`,
  )
})
