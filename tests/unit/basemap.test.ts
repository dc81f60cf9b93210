// The offline basemap's cutting into cells (build/basemap) and the grid the map reads
// (src/components/map/basemap-grid.ts). Areas of hand-drawn shapes are worked out by hand; places
// are from memory, measured with geolib (a general-purpose geodesy library from the registry).
import fc from 'fast-check'
import { getDistance } from 'geolib'
import { describe, expect, it } from 'vitest'
import { clipRing, densify, linesIntoCells, polygonsIntoCells, ringArea, type Polygon } from '../../build/basemap/geometry'
import { Sources, pixelDegrees } from '../../build/basemap/sources'
import { cellAt, cellBounds, cellsCovering, encodePresence, presenceTest } from '../../src/components/map/basemap-grid'

const PORTLAND = { lat: 45.5152, lng: -122.6784 } // Portland, Oregon, city centre (from memory)

const square = (west: number, south: number, size: number) => [
  [west, south],
  [west + size, south],
  [west + size, south + size],
  [west, south + size],
  [west, south],
]

/** A "C": a 6 × 6 square with a 4 × 4 bite out of its east side; 36 − 16 = 20 square degrees (by hand). */
const C_SHAPE = [
  [0, 0],
  [6, 0],
  [6, 1],
  [2, 1],
  [2, 5],
  [6, 5],
  [6, 6],
  [0, 6],
  [0, 0],
]

describe('the grid', () => {
  it('puts Portland, Oregon in the 4° cell from 124° W to 120° W and 42° N to 46° N', () => {
    const { column, row } = cellAt(PORTLAND.lng, PORTLAND.lat, 4)
    expect(cellBounds(column, row, 4)).toEqual({ west: -124, south: 42, east: -120, north: 46 })
  })

  it('asks for one cell for a town-sized view, and for the cells a wide view touches', () => {
    const town = { west: PORTLAND.lng - 0.3, east: PORTLAND.lng + 0.3, south: PORTLAND.lat - 0.2, north: PORTLAND.lat + 0.2 }
    expect(cellsCovering(town, { cellDegrees: 4 })).toHaveLength(1)
    // 125° W to 117° W and 44° N to 47° N crosses 124° W, 120° W and 46° N: 3 columns by 2 rows.
    expect(cellsCovering({ west: -125, east: -117, south: 44, north: 47 }, { cellDegrees: 4 })).toHaveLength(6)
    expect(cellsCovering(town, { cellDegrees: null })).toEqual(['world'])
  })

  it('keeps a view past the antimeridian or the poles inside the world', () => {
    const keys = cellsCovering({ west: -200, east: -170, south: 80, north: 95 }, { cellDegrees: 4 })
    for (const key of keys) {
      const [column, row] = key.split('_').map(Number)
      expect(column).toBeGreaterThanOrEqual(0)
      expect(row).toBeLessThan(45)
    }
  })

  it('reads back exactly the cells it was told are present', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.tuple(fc.integer({ min: 0, max: 89 }), fc.integer({ min: 0, max: 44 })), { maxLength: 60 }),
        (cells) => {
          const present = new Set(cells.map(([c, r]) => `${c}_${r}`))
          const has = presenceTest(encodePresence(present, 4), 4)
          for (let c = 0; c < 90; c += 7) for (let r = 0; r < 45; r += 5) expect(has(`${c}_${r}`)).toBe(present.has(`${c}_${r}`))
          for (const key of present) expect(has(key)).toBe(true)
        },
      ),
    )
  })
})

describe('cutting fills', () => {
  it('clips a square to a rectangle: a 4 × 4 square over the corner of a 2 × 2 cell keeps 1 × 1', () => {
    const clipped = clipRing(square(1, 1, 4), { west: 0, south: 0, east: 2, north: 2 })
    expect(Math.abs(ringArea(clipped))).toBeCloseTo(1, 10)
  })

  it('returns nothing for a ring outside the rectangle', () => {
    expect(clipRing(square(10, 10, 1), { west: 0, south: 0, east: 2, north: 2 })).toEqual([])
  })

  it('cuts a concave shape into cells whose areas add up to the shape’s (20 square degrees)', () => {
    expect(Math.abs(ringArea(C_SHAPE))).toBe(20)
    const cells = polygonsIntoCells([[C_SHAPE]], 2, 0)
    const total = [...cells.values()].flat().reduce((sum, polygon) => sum + Math.abs(ringArea(polygon[0])), 0)
    expect(total).toBeCloseTo(20, 9)
    // The bite (x 2–6, y 1–5) holds no land: the cell from x 2–4, y 2–4 is left out.
    expect(cells.has(`${cellAt(3, 3, 2).column}_${cellAt(3, 3, 2).row}`)).toBe(false)
  })

  it('conserves the area of any rectangle cut into any grid', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -170, max: 160, noNaN: true }),
        fc.double({ min: -80, max: 70, noNaN: true }),
        fc.double({ min: 0.1, max: 15, noNaN: true }),
        fc.constantFrom(1, 2, 4, 8),
        (west, south, size, cellDegrees) => {
          const cells = polygonsIntoCells([[square(west, south, size)]], cellDegrees, 0)
          const total = [...cells.values()].flat().reduce((sum, polygon: Polygon) => sum + Math.abs(ringArea(polygon[0])), 0)
          expect(total).toBeCloseTo(size * size, 6)
        },
      ),
    )
  })

  it('widens each cell by the overlap, so neighbouring fills meet without a gap', () => {
    const cells = polygonsIntoCells([[square(0, 0, 4)]], 2, 0.1)
    const [lower] = cells.get(`${cellAt(1, 1, 2).column}_${cellAt(1, 1, 2).row}`)!
    const xs = lower[0].map(([x]) => x)
    expect(Math.max(...xs)).toBeCloseTo(2.1, 10)
  })
})

describe('cutting lines', () => {
  it('splits a line where it passes into the next cell, the pieces sharing their ends', () => {
    const line = [
      [-125, 45],
      [-119, 45],
    ]
    const cells = linesIntoCells([line], 4)
    // 125° W to 119° W crosses 124° W and 120° W: three cells along the 45th parallel.
    expect([...cells.keys()].sort()).toEqual(['13_33', '14_33', '15_33'])
    const pieces = [...cells.values()].flat().sort((a, b) => a[0][0] - b[0][0])
    for (let i = 1; i < pieces.length; i++) expect(pieces[i][0]).toEqual(pieces[i - 1].at(-1))
    expect(pieces[0][0]).toEqual([-125, 45])
    expect(pieces.at(-1)!.at(-1)).toEqual([-119, 45])
  })

  it('divides a long straight step so every cell it crosses holds a piece', () => {
    expect(
      densify(
        [
          [0, 0],
          [10, 0],
        ],
        1,
      ),
    ).toHaveLength(11)
    // One step from 0° to 16° E over 4° cells: all four cells get their stretch.
    expect(
      linesIntoCells(
        [
          [
            [0.5, 1],
            [15.5, 1],
          ],
        ],
        4,
      ).size,
    ).toBe(4)
  })
})

describe('the US state lines near Portland', () => {
  const sources = new Sources()

  it('include the Oregon–Washington line on the Columbia, in Portland’s cell', () => {
    const cells = linesIntoCells(sources.usStates(10), 4)
    const { column, row } = cellAt(PORTLAND.lng, PORTLAND.lat, 4)
    const lines = cells.get(`${column}_${row}`) ?? []
    // The Columbia between Portland and Vancouver, Washington (from memory): about 45.62° N, 122.67° W.
    const river = { latitude: 45.62, longitude: -122.67 }
    const nearest = Math.min(...lines.flat().map(([lng, lat]) => getDistance(river, { latitude: lat, longitude: lng })))
    expect(nearest).toBeLessThan(3_000)
  })

  it('keep fewer points the further out they are drawn, and only points of the source', () => {
    const fine = sources.usStates(10).flat()
    const coarse = sources.usStates(4).flat()
    expect(coarse.length).toBeLessThan(fine.length / 2)
    const source = new Set(
      sources
        .usStates(16)
        .flat()
        .map(([x, y]) => `${x},${y}`),
    )
    for (const [x, y] of coarse) expect(source.has(`${x},${y}`)).toBe(true)
  })

  it('size pixels as Web Mercator does: 360° over 256 pixels at zoom 0, half as much each zoom further', () => {
    expect(pixelDegrees(0)).toBe(360 / 256)
    expect(pixelDegrees(10)).toBeCloseTo(360 / 262_144, 12)
  })
})
