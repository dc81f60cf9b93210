import type { Feature, MultiLineString, MultiPolygon } from 'geojson'
import { createHash } from 'node:crypto'
import { topology } from 'topojson-server'
import { encodePresence, WHOLE_WORLD, type BasemapIndex, type BasemapTileset } from '../../src/components/map/basemap-grid.ts'
import { linesIntoCells, polygonsIntoCells, type Line, type Polygon } from './geometry.ts'
import { ATTRIBUTION, LAYERS, TILESETS, type LayerSpec, type TilesetSpec } from './layers.ts'
import { pixelDegrees, Sources } from './sources.ts'

export interface BuiltBasemap {
  /** The folder the files go in under the client's root, ending in '/': `assets/basemap-<hash>/`. */
  dir: string
  /** File path inside `dir` → its TopoJSON. */
  files: Map<string, string>
  index: BasemapIndex
}

/** Fills overlap their neighbours by this many pixels at the detail zoom, so no seam shows. */
const OVERLAP_PIXELS = 2

type CellShapes = Map<string, Feature<MultiPolygon> | Feature<MultiLineString>>

const fill = (polygons: Polygon[]): Feature<MultiPolygon> => ({
  type: 'Feature',
  properties: null,
  geometry: { type: 'MultiPolygon', coordinates: polygons },
})
const line = (lines: Line[]): Feature<MultiLineString> => ({
  type: 'Feature',
  properties: null,
  geometry: { type: 'MultiLineString', coordinates: lines },
})

/** Every layer of a tileset, cut into its cells: cell → layer id → shapes. */
function cutTileset(tileset: TilesetSpec, layers: LayerSpec[], sources: Sources): Map<string, CellShapes> {
  const cells = new Map<string, CellShapes>()
  const cellOf = (key: string) => {
    let cell = cells.get(key)
    if (!cell) cells.set(key, (cell = new Map()))
    return cell
  }
  for (const layer of layers) {
    const shapes = layer.shapes(sources, tileset.detailZoom)
    if (tileset.cellDegrees === null) {
      cellOf(WHOLE_WORLD).set(layer.id, shapes.kind === 'fill' ? fill(shapes.polygons) : line(shapes.lines))
      continue
    }
    if (shapes.kind === 'fill') {
      const overlap = OVERLAP_PIXELS * pixelDegrees(tileset.detailZoom)
      for (const [key, polygons] of polygonsIntoCells(shapes.polygons, tileset.cellDegrees, overlap))
        cellOf(key).set(layer.id, fill(polygons))
    } else {
      for (const [key, lines] of linesIntoCells(shapes.lines, tileset.cellDegrees)) cellOf(key).set(layer.id, line(lines))
    }
  }
  return cells
}

/**
 * Coordinates are rounded to a grid of half a pixel at the tileset's detail zoom across the cell
 * (TopoJSON quantization), so each file holds small whole numbers, delta-encoded.
 */
function quantizationFor(tileset: TilesetSpec) {
  const extent = tileset.cellDegrees ?? 360
  return Math.ceil(extent / (pixelDegrees(tileset.detailZoom) / 2))
}

/** Builds every file of the offline basemap and the index the map reads. */
export function buildBasemap(tilesets: TilesetSpec[] = TILESETS, layers: LayerSpec[] = LAYERS): BuiltBasemap {
  const sources = new Sources()
  const files = new Map<string, string>()
  const indexed: BasemapTileset[] = []
  for (const tileset of tilesets) {
    const own = layers.filter((l) => l.tilesets.includes(tileset.id))
    const cells = cutTileset(tileset, own, sources)
    const q = quantizationFor(tileset)
    for (const [key, shapes] of cells) {
      const objects = Object.fromEntries(shapes)
      files.set(`${tileset.id}/${key}.json`, JSON.stringify(topology(objects, q)))
    }
    indexed.push({
      id: tileset.id,
      minZoom: tileset.minZoom,
      maxZoom: tileset.maxZoom,
      cellDegrees: tileset.cellDegrees,
      layers: own.map((l) => ({ id: l.id, kind: l.kind })),
      present: tileset.cellDegrees === null ? null : encodePresence(new Set(cells.keys()), tileset.cellDegrees),
    })
  }
  const hash = createHash('sha256')
  for (const name of [...files.keys()].sort()) hash.update(name).update('\0').update(files.get(name)!).update('\0')
  const dir = `assets/basemap-${hash.digest('hex').slice(0, 10)}/`
  return { dir, files, index: { base: `/${dir}`, attribution: ATTRIBUTION, tilesets: indexed } }
}
