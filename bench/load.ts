// npm run bench:load — plans a 60-piece load on an 8-layer round kiln and a 150-piece load on a car
// kiln, and prints milliseconds per plan (median, p95) and the share of shelf area used, beside a
// plain first-fit by height: tallest pieces first, rows across each shelf, the first shelf with room.

import { gapFor, loadKiln, planLoad, postFor, type LoadKiln, type LoadPiece, type LoadPlan } from '../shared/firing/load'

const TARGET_P95_MS = 200
const WARM_UP = 5
const RUNS = 40

/** A small seeded generator, so every run plans the same pieces. */
function random(seed: number) {
  return () => (seed = (seed * 1_103_515_245 + 12_345) % 2 ** 31) / 2 ** 31
}

/** A community studio's glaze load: mugs, bowls, plates, vases and lidded boxes, made up. */
function mixedLoad(count: number, seed: number): LoadPiece[] {
  const next = random(seed)
  const between = (lo: number, hi: number) => Math.round(lo + next() * (hi - lo))
  const pieces: LoadPiece[] = []
  for (let i = 0; i < count; i++) {
    const kind = i % 5
    const key = `b:${i}:1`
    if (kind === 0 || kind === 1) {
      const d = between(80, 100)
      pieces.push({ key, heightMm: between(90, 120), widthMm: d, depthMm: d, round: true, weightKg: 0.4 })
    } else if (kind === 2) {
      const d = between(140, 220)
      pieces.push({ key, heightMm: between(60, 100), widthMm: d, depthMm: d, round: true, weightKg: 0.7 })
    } else if (kind === 3) {
      const d = between(220, 280)
      pieces.push({ key, heightMm: between(25, 40), widthMm: d, depthMm: d, round: true, weightKg: 0.9 })
    } else {
      const tall = next() < 0.5
      pieces.push({
        key,
        heightMm: tall ? between(200, 300) : between(80, 140),
        widthMm: between(90, 160),
        depthMm: between(90, 160),
        round: tall,
        weightKg: 1.2,
      })
    }
  }
  return pieces
}

const roundKiln = loadKiln({
  interior: { shape: 'round', diameterMm: 711, heightMm: 1350 },
  shelves: { count: 8, widthMm: 660 },
})
const carKiln = loadKiln({
  interior: { shape: 'box', widthMm: 1250, depthMm: 1850, heightMm: 1400 },
  shelves: { count: 30, widthMm: 600, depthMm: 600 },
})

interface Result {
  layers: number
  placed: number
  /** Footprint area of the placed pieces over the area of the shelves in the layers used. */
  share: number
}

const footprint = (p: LoadPiece) => (p.round ? (Math.PI * p.widthMm ** 2) / 4 : p.widthMm * p.depthMm)
const shelfArea = (kiln: LoadKiln) => kiln.shelves.reduce((sum, s) => sum + s.areaMm2, 0)

function ofPlan(kiln: LoadKiln, pieces: LoadPiece[], plan: LoadPlan): Result {
  const byKey = new Map(pieces.map((p) => [p.key, p]))
  const placed = plan.layers.flatMap((l) => l.shelves.flatMap((s) => s.pieces))
  const layers = plan.layers.filter((l) => l.shelves.some((s) => s.pieces.length)).length
  const area = placed.reduce((sum, p) => sum + footprint(byKey.get(p.key)!), 0)
  return { layers, placed: placed.length, share: area / (layers * shelfArea(kiln)) }
}

/**
 * The floor to beat: pieces tallest first; each shelf filled in rows left to right (a row as deep as
 * its first piece), the first shelf with room taking the piece; a new layer when none has room and
 * the stack of posts still fits under the lid.
 */
function firstFitByHeight(kiln: LoadKiln, gap: number, pieces: LoadPiece[]): Result {
  type Row = { y: number; depth: number; x: number }
  type Shelf = { rows: Row[]; geometry: LoadKiln['shelves'][number] }
  const layers: { shelves: Shelf[]; tallest: number }[] = []
  let stack = 0
  let placed = 0
  let area = 0
  const inside = (g: Shelf['geometry'], x0: number, y0: number, w: number, d: number) => {
    if (x0 + w > g.widthMm + 1e-6 || y0 + d > g.depthMm + 1e-6) return false
    if (g.shape === 'box') return true
    // Round shelf: every corner of the footprint's box within the circle.
    const r = g.widthMm / 2
    return [x0, x0 + w].every((x) => [y0, y0 + d].every((y) => (x - r) ** 2 + (y - r) ** 2 <= r * r + 1e-6))
  }
  const tryShelf = (shelf: Shelf, p: LoadPiece) => {
    const w = p.widthMm + gap
    const d = p.depthMm + gap
    for (const row of shelf.rows) {
      if (d <= row.depth && inside(shelf.geometry, row.x, row.y, w - gap, d - gap)) {
        row.x += w
        return true
      }
    }
    const last = shelf.rows[shelf.rows.length - 1]
    // A new row below the last; on a round shelf it starts where the piece first fits inside the circle.
    for (let y = last ? last.y + last.depth : 0; y + d - gap <= shelf.geometry.depthMm; y += 5) {
      for (let x = 0; x + w - gap <= shelf.geometry.widthMm; x += 5) {
        if (inside(shelf.geometry, x, y, w - gap, d - gap)) {
          shelf.rows.push({ y, depth: d, x: x + w })
          return true
        }
      }
    }
    return false
  }
  for (const p of [...pieces].sort((a, b) => b.heightMm - a.heightMm)) {
    let done = layers.some((layer) => p.heightMm <= layer.tallest && layer.shelves.some((s) => tryShelf(s, p)))
    if (!done && layers.length < kiln.layers) {
      const below = layers[layers.length - 1]
      const post = below ? postFor(kiln, below.tallest + kiln.headClearanceMm) : 0
      const base = below ? stack + (post ?? Infinity) + kiln.shelfThicknessMm : 0
      if (base + p.heightMm <= kiln.usableHeightMm) {
        const layer = { shelves: kiln.shelves.map((geometry) => ({ rows: [], geometry })), tallest: p.heightMm }
        layers.push(layer)
        stack = base
        done = layer.shelves.some((s) => tryShelf(s, p))
      }
    }
    if (done) {
      placed++
      area += footprint(p)
    }
  }
  return { layers: layers.length, placed, share: area / (layers.length * shelfArea(kiln)) }
}

function time(plan: () => void): { median: number; p95: number } {
  for (let i = 0; i < WARM_UP; i++) plan()
  const ms: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now()
    plan()
    ms.push(performance.now() - start)
  }
  ms.sort((a, b) => a - b)
  return { median: ms[Math.floor(RUNS / 2)], p95: ms[Math.ceil(RUNS * 0.95) - 1] }
}

const pct = (n: number) => `${(n * 100).toFixed(1)} %`

for (const [name, kiln, count] of [
  ['round kiln (660 mm shelves)', roundKiln, 60],
  ['car kiln (600 × 600 mm shelves)', carKiln, 150],
] as const) {
  const pieces = mixedLoad(count, count)
  const gap = gapFor(kiln, 'glaze')
  const plan = planLoad({ kiln, gapMm: gap, pieces })
  const ours = ofPlan(kiln, pieces, plan)
  const oursMs = time(() => planLoad({ kiln, gapMm: gap, pieces }))
  const floor = firstFitByHeight(kiln, gap, pieces)
  const floorMs = time(() => firstFitByHeight(kiln, gap, pieces))
  console.log(
    `${count} pieces on a ${name}: ${kiln.layers} layers, ${kiln.shelves.length} ${kiln.shelves.length === 1 ? 'shelf' : 'shelves'} a layer`,
  )
  console.log(
    `  planner:      median ${oursMs.median.toFixed(1)} ms, p95 ${oursMs.p95.toFixed(1)} ms; ${ours.placed}/${count} placed in ${ours.layers} layers; shelf area used ${pct(ours.share)}`,
  )
  console.log(
    `  first-fit:    median ${floorMs.median.toFixed(1)} ms, p95 ${floorMs.p95.toFixed(1)} ms; ${floor.placed}/${count} placed in ${floor.layers} layers; shelf area used ${pct(floor.share)}`,
  )
  console.log(
    `  target: p95 ≤ ${TARGET_P95_MS} ms ${oursMs.p95 <= TARGET_P95_MS ? 'met' : 'MISSED'}; fuller than first-fit ${ours.placed > floor.placed || (ours.placed === floor.placed && ours.share > floor.share) ? 'yes' : 'NO'}`,
  )
}
