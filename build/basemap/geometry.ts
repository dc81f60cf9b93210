import type { Position } from 'geojson'
import { cellAt, cellBounds, cellKey, cellsCovering, type Bounds } from '../../src/components/map/basemap-grid.ts'

// Cutting the basemap's shapes into the cells of a grid (longitude and latitude in degrees).
// Fills are clipped to each cell, a little wider than the cell so neighbours overlap and no
// hairline of sea shows between them; lines are split where they pass from cell to cell and not
// clipped, so no line is drawn twice or broken; points go to the cell they fall in.

export type Ring = Position[]
/** An outer ring, then its holes. */
export type Polygon = Ring[]
export type Line = Position[]

/**
 * A closed ring clipped to the slab `min <= coordinate[axis] <= max` (Sutherland–Hodgman, against
 * the slab's two edges). Where the ring leaves and comes back, the result runs along the edge:
 * invisible under a fill drawn without a stroke, which is how the basemap draws land.
 */
function clipToSlab(points: Position[], axis: 0 | 1, min: number, max: number): Position[] {
  const other = axis === 0 ? 1 : 0
  for (const [limit, keepAbove] of [
    [min, true],
    [max, false],
  ] as const) {
    if (points.length === 0) break
    const next: Position[] = []
    let previous = points[points.length - 1]
    let previousIn = keepAbove ? previous[axis] >= limit : previous[axis] <= limit
    for (const current of points) {
      const currentIn = keepAbove ? current[axis] >= limit : current[axis] <= limit
      if (currentIn !== previousIn) {
        const t = (limit - previous[axis]) / (current[axis] - previous[axis])
        const crossing: Position = [0, 0]
        crossing[axis] = limit
        crossing[other] = previous[other] + (current[other] - previous[other]) * t
        next.push(crossing)
      }
      if (currentIn) next.push(current)
      previous = current
      previousIn = currentIn
    }
    points = next
  }
  return points
}

function closeRing(points: Position[]): Ring {
  if (points.length < 3) return []
  const closed = [...points, points[0]]
  // A ring that only ran along the rectangle's edges encloses nothing.
  return Math.abs(ringArea(closed)) > 1e-12 ? closed : []
}

/** A closed ring clipped to a rectangle; a closed ring, or [] when nothing is inside. */
export function clipRing(ring: Ring, bounds: Bounds): Ring {
  const open = ring.slice(0, -1)
  return closeRing(clipToSlab(clipToSlab(open, 0, bounds.west, bounds.east), 1, bounds.south, bounds.north))
}

export function boundsOf(points: readonly Position[]): Bounds {
  let west = Infinity
  let south = Infinity
  let east = -Infinity
  let north = -Infinity
  for (const [x, y] of points) {
    if (x < west) west = x
    if (x > east) east = x
    if (y < south) south = y
    if (y > north) north = y
  }
  return { west, south, east, north }
}

const widen = (b: Bounds, by: number): Bounds => ({ west: b.west - by, south: b.south - by, east: b.east + by, north: b.north + by })

/**
 * Fills by cell, each clipped to its cell widened by `overlap` degrees. A polygon is first cut into
 * strips, one per row of cells it spans, and each strip into cells: a continent's coast is then
 * walked once per row and once per cell of its own strip, not once per cell of its whole extent.
 */
export function polygonsIntoCells(polygons: readonly Polygon[], cellDegrees: number, overlap: number): Map<string, Polygon[]> {
  const cells = new Map<string, Polygon[]>()
  const add = (key: string, polygon: Polygon) => {
    const list = cells.get(key)
    if (list) list.push(polygon)
    else cells.set(key, [polygon])
  }
  // Rows first (latitude), then cells along the row (longitude): a strip is already inside its row.
  const clipPolygon = (polygon: Polygon, axis: 0 | 1, min: number, max: number): Polygon | null => {
    const ring = (r: Ring) => closeRing(clipToSlab(r.slice(0, -1), axis, min, max))
    const outer = ring(polygon[0])
    if (outer.length === 0) return null
    return [
      outer,
      ...polygon
        .slice(1)
        .map(ring)
        .filter((hole) => hole.length > 0),
    ]
  }
  for (const polygon of polygons) {
    const outerBounds = boundsOf(polygon[0])
    const keys = cellsCovering(outerBounds, { cellDegrees })
    const rows = new Map<number, number[]>()
    for (const key of keys) {
      const [column, row] = key.split('_').map(Number)
      rows.set(row, [...(rows.get(row) ?? []), column])
    }
    for (const [row, columns] of rows) {
      const band = widen(cellBounds(0, row, cellDegrees), overlap)
      const strip =
        outerBounds.south >= band.south && outerBounds.north <= band.north ? polygon : clipPolygon(polygon, 1, band.south, band.north)
      if (!strip) continue
      const stripBounds = boundsOf(strip[0])
      for (const column of columns) {
        const clip = widen(cellBounds(column, row, cellDegrees), overlap)
        if (!boundsMeet(stripBounds, clip)) continue
        const piece = stripBounds.west >= clip.west && stripBounds.east <= clip.east ? strip : clipPolygon(strip, 0, clip.west, clip.east)
        if (piece) add(cellKey(column, row), piece)
      }
    }
  }
  return cells
}

const boundsMeet = (a: Bounds, b: Bounds) => a.west <= b.east && a.east >= b.west && a.south <= b.north && a.north >= b.south

/** The line with points added so no step is longer than `maxStep` degrees. */
export function densify(line: Line, maxStep: number): Line {
  const out: Position[] = [line[0]]
  for (let i = 1; i < line.length; i++) {
    const [x0, y0] = line[i - 1]
    const [x1, y1] = line[i]
    const steps = Math.ceil(Math.max(Math.abs(x1 - x0), Math.abs(y1 - y0)) / maxStep)
    for (let s = 1; s < steps; s++) out.push([x0 + ((x1 - x0) * s) / steps, y0 + ((y1 - y0) * s) / steps])
    out.push(line[i])
  }
  return out
}

/**
 * Lines by cell: each step belongs to the cell of its midpoint, and a line is cut where the cell
 * changes, the two pieces sharing the point between them. Long steps are first divided, so a
 * long straight border still reaches every cell it crosses.
 */
export function linesIntoCells(lines: readonly Line[], cellDegrees: number): Map<string, Line[]> {
  const cells = new Map<string, Line[]>()
  for (const raw of lines) {
    const line = densify(raw, cellDegrees / 4)
    let key: string | null = null
    let piece: Line = []
    const flush = () => {
      if (key !== null && piece.length >= 2) {
        const list = cells.get(key)
        if (list) list.push(piece)
        else cells.set(key, [piece])
      }
    }
    for (let i = 1; i < line.length; i++) {
      const a = line[i - 1]
      const b = line[i]
      const { column, row } = cellAt((a[0] + b[0]) / 2, (a[1] + b[1]) / 2, cellDegrees)
      const here = cellKey(column, row)
      if (here !== key) {
        flush()
        key = here
        piece = [a]
      }
      piece.push(b)
    }
    flush()
  }
  return cells
}

/** Points by the cell they fall in. */
export function pointsIntoCells<T extends { coordinates: Position }>(points: readonly T[], cellDegrees: number): Map<string, T[]> {
  const cells = new Map<string, T[]>()
  for (const point of points) {
    const { column, row } = cellAt(point.coordinates[0], point.coordinates[1], cellDegrees)
    const key = cellKey(column, row)
    const list = cells.get(key)
    if (list) list.push(point)
    else cells.set(key, [point])
  }
  return cells
}

/** Area of a ring in square degrees by the shoelace formula; positive when anticlockwise. */
export function ringArea(ring: Ring): number {
  let twice = 0
  for (let i = 1; i < ring.length; i++) twice += ring[i - 1][0] * ring[i][1] - ring[i][0] * ring[i - 1][1]
  return twice / 2
}
