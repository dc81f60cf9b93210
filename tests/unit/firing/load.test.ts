import { describe, expect, it } from 'vitest'
import {
  HEAD_CLEARANCE_MM,
  POST_HEIGHTS_MM,
  loadKiln,
  piecesOfLine,
  planLoad,
  shelfShare,
  spotOnShelf,
  type LoadKiln,
} from '../../../shared/firing/load'
import { MM_PER_INCH } from '../../../shared/firing/units'
import { TAG_ALPHABET, newTag, readTag } from '../../../shared/firing/tags'

/** A kiln of one round shelf of this diameter, tall enough for one layer of short ware. */
function oneRoundShelf(diameterMm: number): LoadKiln {
  return loadKiln({
    interior: { shape: 'round', diameterMm: diameterMm + 50, heightMm: 200 },
    usableHeightMm: 150,
    shelves: { count: 1, widthMm: diameterMm },
  })
}

function placedOn(kiln: LoadKiln, gapMm: number, pieces: ReturnType<typeof piecesOfLine>): number {
  const plan = planLoad({ kiln, gapMm, pieces, maxLayers: 1 })
  return plan.layers.reduce((sum, layer) => sum + layer.shelves.reduce((s, shelf) => s + shelf.pieces.length, 0), 0)
}

const discs = (n: number, diameterMm: number) =>
  piecesOfLine('r:0', { quantity: n, heightMm: 50, widthMm: diameterMm, depthMm: diameterMm, round: true })

// The smallest circle holding n equal circles of radius 1 (R/r), from the published tables of
// packings of equal circles in a circle (E. Specht's "Packomania" tables; values from memory, each
// a closed form: n = 2: 2; n = 3: 1 + 2/√3; n = 4: 1 + √2; n = 5: 1 + √(2(1 + 1/√5)); n = 6 and 7: 3).
const CIRCLES_IN_A_CIRCLE: [number, number][] = [
  [2, 2],
  [3, 1 + 2 / Math.sqrt(3)],
  [4, 1 + Math.SQRT2],
  [5, 1 + Math.sqrt(2 * (1 + 1 / Math.sqrt(5)))],
  [6, 3],
  [7, 3],
]

describe('round shelves against the published circles-in-a-circle packings', () => {
  it.each(CIRCLES_IN_A_CIRCLE)('never puts %i plates on a shelf 1 %% smaller than the optimum packing needs', (n, ratio) => {
    const plate = 100
    expect(placedOn(oneRoundShelf(plate * ratio * 0.99), 0, discs(n, plate))).toBeLessThan(n)
  })

  it.each([
    [2, 2],
    [7, 3],
  ])('reaches the optimum of %i plates where it is a row or a hexagon (R/r = %d)', (n, ratio) => {
    const plate = 100
    expect(placedOn(oneRoundShelf(plate * ratio * 1.001), 0, discs(n + 1, plate))).toBe(n)
  })

  it('the four 10½ in plates on a 555 mm round shelf: two to a shelf, so two shelves (the issue’s example)', () => {
    const kiln = loadKiln({
      interior: { shape: 'round', diameterMm: 600, heightMm: 700 },
      usableHeightMm: 650,
      shelves: { count: 6, widthMm: 555 },
    })
    const plates = piecesOfLine('p:0', { quantity: 4, heightMm: 30, widthMm: 10.5 * MM_PER_INCH, depthMm: 10.5 * MM_PER_INCH, round: true })
    // ½ in (13 mm) between glazed pieces (common practice): 2 × 266.7 + 13 = 546.4 mm ≤ 555 mm.
    expect(placedOn(oneRoundShelf(555), 13, plates)).toBe(2)
    expect(shelfShare(kiln, 13, plates).shelves).toBe(2)
  })
})

describe('box shelves', () => {
  const box = (w: number, d: number) =>
    loadKiln({
      interior: { shape: 'box', widthMm: w + 50, depthMm: d + 50, heightMm: 200 },
      usableHeightMm: 150,
      shelves: { count: 1, widthMm: w, depthMm: d },
    })

  it('a 200 × 200 mm shelf takes four 100 mm squares edge to edge and no fifth (elementary geometry)', () => {
    const squares = piecesOfLine('s:0', { quantity: 5, heightMm: 50, widthMm: 100, depthMm: 100 })
    expect(placedOn(box(200, 200), 0, squares)).toBe(4)
  })

  it('keeps the gap: with ½ in between glazed pieces (common practice) the same shelf takes one', () => {
    const squares = piecesOfLine('s:0', { quantity: 2, heightMm: 50, widthMm: 100, depthMm: 100 })
    expect(placedOn(box(200, 200), 13, squares)).toBe(1)
  })
})

describe('layers on posts', () => {
  it('stands the layer above a 100 mm mug on the shortest post stack that clears it by the head clearance', () => {
    const kiln = loadKiln({
      interior: { shape: 'round', diameterMm: 711, heightMm: 686 },
      usableHeightMm: 660,
      shelves: { count: 6, widthMm: 660 },
    })
    // 60 mugs fill more than one 660 mm shelf, so a second layer goes on posts over the first.
    const mugs = piecesOfLine('m:0', { quantity: 60, heightMm: 100, widthMm: 90, depthMm: 90, round: true })
    const plan = planLoad({ kiln, gapMm: 13, pieces: mugs })
    const need = 100 + HEAD_CLEARANCE_MM
    expect(plan.layers.length).toBeGreaterThan(1)
    // Up to three posts stacked (common practice) from sizes ½ in to 10 in (common sizes, from
    // memory): the shortest stack over 113 mm is ½ + 1 + 3 in = 13 + 25 + 76 = 114 mm.
    const stacks = POST_HEIGHTS_MM.flatMap((a) => [a, ...POST_HEIGHTS_MM.flatMap((b) => [a + b, ...POST_HEIGHTS_MM.map((c) => a + b + c)])])
    expect(Math.min(...stacks.filter((h) => h >= need))).toBe(114)
    expect(plan.layers[0].postMm).toBe(114)
    expect(plan.stackMm).toBeLessThanOrEqual(kiln.usableHeightMm)
    expect(plan.unplaced).toEqual([])
  })

  it('a piece taller than the usable height finds no place, and says why', () => {
    const kiln = oneRoundShelf(400)
    const plan = planLoad({ kiln, gapMm: 13, pieces: piecesOfLine('v:0', { quantity: 1, heightMm: 400, widthMm: 100, depthMm: 100 }) })
    expect(plan.unplaced).toEqual([{ key: 'v:0:1', reason: 'too-tall' }])
  })
})

describe('tag codes', () => {
  it('use no characters that look alike (1/I/L, 0/O/Q/D, 2/Z, 5/S, 8/B, 6/G, U/V: common practice for codes read by eye)', () => {
    for (const pair of ['1I', '1L', '0O', '0Q', '0D', '2Z', '5S', '8B', '6G', 'UV'])
      expect([...pair].filter((c) => TAG_ALPHABET.includes(c)).length).toBeLessThanOrEqual(1)
    expect(new Set(TAG_ALPHABET).size).toBe(TAG_ALPHABET.length)
  })

  it('catch every single mistyped character and every swap of two neighbours (weighted sum modulo a prime, as in ISO 7064)', () => {
    let seed = 7
    const bytes = (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) & 0xff)
    for (let t = 0; t < 40; t++) {
      const tag = newTag(bytes)
      expect(readTag(tag)).toEqual({ ok: true, tag })
      const compact = tag.replace('-', '')
      for (let i = 0; i < compact.length; i++) {
        for (const c of TAG_ALPHABET) {
          if (c === compact[i]) continue
          expect(readTag(compact.slice(0, i) + c + compact.slice(i + 1)).ok).toBe(false)
        }
      }
      for (let i = 0; i + 1 < 7; i++) {
        if (compact[i] === compact[i + 1]) continue
        const swapped = compact.slice(0, i) + compact[i + 1] + compact[i] + compact.slice(i + 2)
        expect(readTag(swapped).ok).toBe(false)
      }
    }
  })

  it('read a code typed in lower case, with spaces, or with a look-alike letter for a digit', () => {
    const tag = newTag(() => Uint8Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16]))
    expect(readTag(` ${tag.toLowerCase().replace('-', ' ')} `)).toEqual({ ok: true, tag })
    expect(readTag(tag.replace(/0/g, 'O'))).toEqual({ ok: true, tag })
  })
})

describe('a crew move to another shelf', () => {
  it('finds the spot beside one 10½ in plate on a 555 mm shelf, and none beside two (the issue’s example)', () => {
    const kiln = oneRoundShelf(555)
    const [first, second, third] = piecesOfLine('p:0', {
      quantity: 3,
      heightMm: 30,
      widthMm: 10.5 * MM_PER_INCH,
      depthMm: 10.5 * MM_PER_INCH,
      round: true,
    })
    const spot = spotOnShelf(kiln, 13, 0, [], first)!
    const standing = [{ ...first, ...spot }]
    const next = spotOnShelf(kiln, 13, 0, standing, second)
    expect(next).not.toBeNull()
    // Where it says the piece goes, the planner lets it stand: ½ in apart (common practice) and on the shelf.
    const plan = planLoad({
      kiln,
      gapMm: 13,
      pieces: [first, second],
      pins: [
        { key: first.key, layer: 0, shelf: 0, ...spot },
        { key: second.key, layer: 0, shelf: 0, ...next! },
      ],
      maxLayers: 1,
    })
    expect(plan.problems).toEqual([])
    expect(spotOnShelf(kiln, 13, 0, [...standing, { ...second, ...next! }], third)).toBeNull()
  })
})
