import type { LayerKind } from '../../src/components/map/basemap-grid.ts'
import type { Line, Polygon } from './geometry.ts'
import type { Sources } from './sources.ts'

// What the offline basemap holds, in one place. A tileset is one level of detail: a range of zooms,
// a cell size and the zoom its shapes are simplified for. A layer is one kind of shape drawn in
// some tilesets; the map draws the layers in this order, bottom first, and styles them by id
// (src/components/map/Basemap.tsx). To add a layer, add it here with the tilesets it belongs to
// and give it a style there.

export interface TilesetSpec {
  id: string
  minZoom: number
  maxZoom: number
  /** null: the whole world in one file. */
  cellDegrees: number | null
  /** Shapes are simplified, and coordinates rounded, for this zoom. */
  detailZoom: number
}

export type Shapes = { kind: 'fill'; polygons: Polygon[] } | { kind: 'line'; lines: Line[] }

export interface LayerSpec {
  id: string
  kind: LayerKind
  tilesets: string[]
  shapes(sources: Sources, zoom: number): Shapes
}

export const TILESETS: TilesetSpec[] = [
  // The continents and the states at a glance: one small file, the first thing any map shows.
  { id: 'world', minZoom: 0, maxZoom: 5, cellDegrees: null, detailZoom: 4 },
  // A region of a few states.
  { id: 'region', minZoom: 6, maxZoom: 7, cellDegrees: 8, detailZoom: 7 },
  // A town and its surroundings, as the search results and a studio's page show them; the sources
  // hold no more detail than this, so deeper zooms draw the same shapes larger.
  { id: 'local', minZoom: 8, maxZoom: 18, cellDegrees: 4, detailZoom: 10 },
]

const ALL = TILESETS.map((t) => t.id)

export const LAYERS: LayerSpec[] = [
  { id: 'land', kind: 'fill', tilesets: ALL, shapes: (s, z) => ({ kind: 'fill', polygons: s.land(z) }) },
  { id: 'counties', kind: 'line', tilesets: ['local'], shapes: (s, z) => ({ kind: 'line', lines: s.usCounties(z) }) },
  { id: 'states', kind: 'line', tilesets: ALL, shapes: (s, z) => ({ kind: 'line', lines: s.usStates(z) }) },
  { id: 'borders', kind: 'line', tilesets: ALL, shapes: (s, z) => ({ kind: 'line', lines: s.borders(z) }) },
  { id: 'coast', kind: 'line', tilesets: ALL, shapes: (s, z) => ({ kind: 'line', lines: s.coast(z) }) },
]

export const ATTRIBUTION = 'Map data: Natural Earth, U.S. Census Bureau'
