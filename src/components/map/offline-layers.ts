import type { GeoJsonObject } from 'geojson'
import { feature } from 'topojson-client'
import type { GeometryObject, Topology } from 'topojson-specification'
import index from 'virtual:conewright-basemap'
import { cellsCovering, cellUrl, presenceTest, type Bounds, type BasemapTileset } from './basemap-grid'

// The offline basemap's files: cells of TopoJSON written by the build (build/basemap) under our own
// origin, cached for good (their folder is named by their content) and sent compressed. A map asks
// only for the cells of the tilesets drawn at its zoom that touch what it shows.

export const basemapIndex = index

/** One cell's shapes as GeoJSON, by layer id. */
export type CellShapes = Record<string, GeoJsonObject>

export interface WantedCell {
  tileset: BasemapTileset
  key: string
}

const presence = new Map(
  index.tilesets.map((t) => [t.id, t.present === null || t.cellDegrees === null ? () => true : presenceTest(t.present, t.cellDegrees)]),
)

/** The cells a map at this zoom showing these bounds draws: open sea has no file and is not asked for. */
export function cellsFor(zoom: number, bounds: Bounds): WantedCell[] {
  return index.tilesets
    .filter((t) => zoom >= t.minZoom && zoom <= t.maxZoom)
    .flatMap((tileset) =>
      cellsCovering(bounds, tileset)
        .filter((key) => presence.get(tileset.id)!(key))
        .map((key) => ({ tileset, key })),
    )
}

export async function loadCell({ tileset, key }: WantedCell): Promise<CellShapes> {
  const url = cellUrl(index, tileset, key)
  const res = await fetch(url, { credentials: 'same-origin' })
  if (!res.ok) throw new Error(`The map outline at ${url} answered ${res.status}.`)
  const topology = (await res.json()) as Topology<Record<string, GeometryObject>>
  return Object.fromEntries(Object.entries(topology.objects).map(([layer, object]) => [layer, feature(topology, object) as GeoJsonObject]))
}
