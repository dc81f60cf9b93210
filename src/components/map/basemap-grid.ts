// The offline basemap is cut into cells of a fixed size in degrees, one grid per tileset, so a map
// fetches only the cells it shows. The build (build/basemap) and the map (Basemap.tsx) both place
// cells with these functions, and nothing else.

export interface Bounds {
  west: number
  south: number
  east: number
  north: number
}

/** How a tileset is laid out: one file for the world (`cellDegrees` null) or a grid of cells. */
export interface TilesetGrid {
  cellDegrees: number | null
}

/** The one file of a tileset drawn whole. */
export const WHOLE_WORLD = 'world'

export function columnsOf(cellDegrees: number) {
  return Math.ceil(360 / cellDegrees)
}

export function rowsOf(cellDegrees: number) {
  return Math.ceil(180 / cellDegrees)
}

/** The name of a cell and of its file: column and row counted from 180° W and 90° S. */
export function cellKey(column: number, row: number) {
  return `${column}_${row}`
}

export function cellAt(lng: number, lat: number, cellDegrees: number): { column: number; row: number } {
  const column = Math.min(columnsOf(cellDegrees) - 1, Math.max(0, Math.floor((lng + 180) / cellDegrees)))
  const row = Math.min(rowsOf(cellDegrees) - 1, Math.max(0, Math.floor((lat + 90) / cellDegrees)))
  return { column, row }
}

export function cellBounds(column: number, row: number, cellDegrees: number): Bounds {
  return {
    west: -180 + column * cellDegrees,
    south: -90 + row * cellDegrees,
    east: Math.min(180, -180 + (column + 1) * cellDegrees),
    north: Math.min(90, -90 + (row + 1) * cellDegrees),
  }
}

/** Every cell that touches the bounds (clamped to the world), west to east, south to north. */
export function cellsCovering(bounds: Bounds, grid: TilesetGrid): string[] {
  if (grid.cellDegrees === null) return [WHOLE_WORLD]
  const lo = cellAt(Math.max(-180, bounds.west), Math.max(-90, bounds.south), grid.cellDegrees)
  const hi = cellAt(Math.min(180, bounds.east), Math.min(90, bounds.north), grid.cellDegrees)
  const keys: string[] = []
  for (let row = lo.row; row <= hi.row; row++) for (let column = lo.column; column <= hi.column; column++) keys.push(cellKey(column, row))
  return keys
}

/**
 * Which cells hold anything, as a bit per cell (row by row from the south-west) in base64: the map
 * asks only for those, and open sea costs no request. A whole-world tileset always has its file.
 */
export function encodePresence(present: ReadonlySet<string>, cellDegrees: number): string {
  const columns = columnsOf(cellDegrees)
  const bits = new Uint8Array(Math.ceil((columns * rowsOf(cellDegrees)) / 8))
  for (const key of present) {
    const [column, row] = key.split('_').map(Number)
    const i = row * columns + column
    bits[i >> 3] |= 1 << (i & 7)
  }
  let binary = ''
  for (const byte of bits) binary += String.fromCharCode(byte)
  return btoa(binary)
}

export function presenceTest(encoded: string, cellDegrees: number): (key: string) => boolean {
  const columns = columnsOf(cellDegrees)
  const binary = atob(encoded)
  return (key) => {
    const [column, row] = key.split('_').map(Number)
    const i = row * columns + column
    return i >> 3 < binary.length && (binary.charCodeAt(i >> 3) & (1 << (i & 7))) !== 0
  }
}

export type LayerKind = 'fill' | 'line' | 'point'

/** What the build tells the map about the basemap it wrote (the `virtual:conewright-basemap` module). */
export interface BasemapIndex {
  /** The folder of the files, ending in '/': named by a hash of everything in it, so cached for good. */
  base: string
  /** Credits for the data drawn. */
  attribution: string
  tilesets: BasemapTileset[]
}

export interface BasemapTileset extends TilesetGrid {
  id: string
  /** Drawn from minZoom to maxZoom, both included. */
  minZoom: number
  maxZoom: number
  /** Drawn in this order, bottom first; each is one object of every file of the tileset. */
  layers: { id: string; kind: LayerKind }[]
  /** From encodePresence; null for a whole-world tileset. */
  present: string | null
}

export function cellUrl(index: BasemapIndex, tileset: BasemapTileset, key: string) {
  return `${index.base}${tileset.id}/${key}.json`
}
