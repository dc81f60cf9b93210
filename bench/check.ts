// npm run bench:check — ware checks per second for a 20-piece request, firing schedule included.
// Warms up first, then runs timed rounds and reports each round and the median beside the target.

import { checkWare, type Firing, type Kiln, type Piece } from '../shared/firing/check'

const TARGET_PER_SECOND = 10_000
const WARM_UP_MS = 1_000
const ROUNDS = 7
const ROUND_MS = 1_000

const kiln: Kiln = {
  kind: 'electric',
  atmospheres: ['oxidation'],
  interior: { shape: 'round', diameterMm: 580, heightMm: 690 },
  minCone: '022',
  maxCone: '10',
  maxTempC: 1300,
  maxRampCPerHour: 300,
  preheatHold: true,
  controlledCooling: false,
  // Exercises the shelf plan on every check.
  shelfLoadKg: 25,
}

const firing: Firing = {
  kind: 'glaze',
  cone: '6',
  atmosphere: 'oxidation',
  slowCool: false,
  cooling: 'glaze-development',
  sharedLoad: true,
}

const stoneware = { body: 'stoneware' as const, minCone: '5', maxCone: '7' }

function piece(index: number): Piece {
  // A realistic mixed load: mugs, bowls, plates and a few pieces that raise findings.
  const kind = index % 5
  const base: Piece = {
    label: `Piece ${index + 1}`,
    quantity: 1 + (index % 4),
    heightMm: [110, 90, 30, 260, 180][kind],
    widthMm: [90, 180, 260, 140, 120][kind],
    depthMm: [90, 180, 260, 140, 120][kind],
    round: kind !== 4,
    wallThicknessMm: [6, 7, 8, 9, 16][kind],
    form: kind === 4 ? 'closed' : 'open',
    ventHole: true,
    weightG: [400, 700, 1200, 1500, 2500][kind],
    clay: stoneware,
    state: 'bisque',
    glaze: {
      minCone: '5',
      maxCone: '7',
      runny: index === 7,
      onFoot: index === 11,
      support: 'none',
      colourants: index === 5 ? ['copper'] : [],
      tested: index !== 9,
    },
  }
  return index === 13 ? { ...base, heightMm: 700 } : base
}

const pieces: Piece[] = Array.from({ length: 20 }, (_, index) => piece(index))

// The worst case for the message text: every piece raises several findings.
const troublesome: Piece[] = pieces.map((p) => ({
  ...p,
  heightMm: 700,
  state: 'greenware',
  boneDry: false,
  wallThicknessMm: 20,
  form: 'closed',
  ventHole: false,
  materials: ['glass', 'metal'],
  glaze: {
    minCone: '04',
    maxCone: '04',
    runny: true,
    onFoot: true,
    support: 'stilt',
    colourants: ['chrome-tin'],
    tested: false,
    reductionOnly: true,
  },
}))

let sink = 0
function runFor(load: Piece[], milliseconds: number): number {
  const start = performance.now()
  let checks = 0
  let now = start
  while (now - start < milliseconds) {
    // Batches of 100 keep the clock reads out of the measured cost.
    for (let i = 0; i < 100; i++) {
      const check = checkWare(kiln, firing, load)
      sink += check.findings.length + check.schedule.segments.length
    }
    checks += 100
    now = performance.now()
  }
  return (checks * 1000) / (now - start)
}

function bench(name: string, load: Piece[]): void {
  const sample = checkWare(kiln, firing, load)
  console.log(
    `${name}: ${load.length} pieces, schedule included (verdict ${sample.verdict}, ` +
      `${sample.findings.length} findings, ${sample.schedule.segments.length} segments)`,
  )
  runFor(load, WARM_UP_MS)
  const rates: number[] = []
  for (let round = 1; round <= ROUNDS; round++) {
    const rate = runFor(load, ROUND_MS)
    rates.push(rate)
    console.log(`  round ${round}: ${Math.round(rate).toLocaleString('en-US')} checks/s`)
  }
  const median = [...rates].sort((a, b) => a - b)[Math.floor(rates.length / 2)]
  const verdict = median >= TARGET_PER_SECOND ? 'meets' : 'MISSES'
  console.log(
    `  median ${Math.round(median).toLocaleString('en-US')} checks/s (${(1e6 / median).toFixed(1)} µs per check); ` +
      `target ≥ ${TARGET_PER_SECOND.toLocaleString('en-US')} checks/s: ${verdict} the target`,
  )
}

bench('mixed glaze load', pieces)
bench('every piece with findings', troublesome)
if (sink === 0) console.log('no work measured')
