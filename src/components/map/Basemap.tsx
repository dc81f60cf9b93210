import 'leaflet/dist/leaflet.css'
import { useQueries, useQueryClient } from '@tanstack/react-query'
import type { GridLayer, Map as LeafletMap, PathOptions } from 'leaflet'
import { useEffect, useRef, useState, type ReactNode, type Ref } from 'react'
import { GeoJSON, MapContainer, Pane, TileLayer, useMap, useMapEvents } from 'react-leaflet'
import { useSiteMeta } from '../../lib/meta'
import type { Bounds } from './basemap-grid'
import { basemapIndex, cellsFor, loadCell, type CellShapes, type WantedCell } from './offline-layers'
import { TownLabels } from './TownLabels'

export type LatLngPair = [lat: number, lng: number]

export interface MapBounds {
  north: number
  south: number
  east: number
  west: number
}

export interface BasemapProps {
  center: LatLngPair
  zoom: number
  /** Sizes the map (it needs a height), e.g. "h-96 rounded-card". */
  className?: string
  /** The map's accessible name. */
  label?: string
  onMoveEnd?: (bounds: MapBounds, center: LatLngPair, zoom: number) => void
  /** Markers and other layers drawn over the basemap. */
  children?: ReactNode
  ref?: Ref<LeafletMap>
}

export const OFFLINE_ATTRIBUTION = basemapIndex.attribution

// Colours come from the design tokens through Tailwind classes on the SVG paths; the stroke and
// fill attributes Leaflet writes lose to any stylesheet rule. Land is filled without a stroke (its
// cells overlap at their edges); the coast is drawn as a line of its own.
const LAYER_STYLES: Record<string, PathOptions> = {
  land: { className: 'fill-slip-100', stroke: false, fillOpacity: 1 },
  coast: { className: 'stroke-water-300', weight: 1, fill: false },
  borders: { className: 'stroke-slip-400', weight: 1, fill: false },
  states: { className: 'stroke-slip-300', weight: 1, dashArray: '4 3', fill: false },
  counties: { className: 'stroke-slip-200', weight: 0.75, fill: false },
}
const OTHER_LAYER: PathOptions = { className: 'stroke-slip-300', weight: 1, fill: false }

/** Every layer the basemap has, bottom first; each gets a pane so land stays under every line. */
const LAYER_ORDER = [...new Set(basemapIndex.tilesets.flatMap((t) => t.layers.map((l) => l.id)))]

/** Which basemap an installation draws: its PMTiles file, then its tile server, then our own cells. */
export type BasemapSource = 'pending' | 'pmtiles' | 'tiles' | 'offline'

export function basemapSource(meta: { tileUrl: string | null; basemapPmtilesUrl: string | null } | undefined): BasemapSource {
  if (!meta) return 'pending'
  return meta.basemapPmtilesUrl ? 'pmtiles' : meta.tileUrl ? 'tiles' : 'offline'
}

/**
 * A map: the vector basemap in the PMTiles file of `BASEMAP_PMTILES_URL` when the installation has
 * one, else tiles from `TILE_URL` when it has a tile server, otherwise land, borders, US states and
 * (zoomed in) counties drawn from TopoJSON shipped with the app. Nothing is fetched from anywhere the
 * installation did not name. The wrapper carries `data-testid="basemap"`, `data-basemap-source` and,
 * once the basemap is drawn, `data-basemap-ready="true"`.
 */
export function Basemap({ center, zoom, className = 'h-96', label = 'Map', onMoveEnd, children, ref }: BasemapProps) {
  const meta = useSiteMeta()
  const [ready, setReady] = useState(false)
  const source = basemapSource(meta.isPending ? undefined : { tileUrl: null, basemapPmtilesUrl: null, ...meta.data })
  const tileUrl = meta.data?.tileUrl ?? null

  return (
    <div
      role="region"
      aria-label={label}
      data-testid="basemap"
      data-basemap-source={source}
      data-basemap-ready={ready ? 'true' : 'false'}
      className={`relative isolate overflow-hidden ${className}`}
    >
      <MapContainer
        ref={ref}
        center={center}
        zoom={zoom}
        minZoom={2}
        maxZoom={source === 'offline' ? 16 : 18}
        className="size-full"
        // leaflet.css paints the container grey, unlayered; an inline style beats it.
        style={{ background: 'var(--color-water-100)' }}
        worldCopyJump={false}
      >
        <FollowView center={center} zoom={zoom} />
        {onMoveEnd && <MoveEndReporter onMoveEnd={onMoveEnd} />}
        {source === 'tiles' && (
          <TileLayer url={tileUrl!} attribution={`Map tiles: ${tileHost(tileUrl!)}`} eventHandlers={{ load: () => setReady(true) }} />
        )}
        {source === 'pmtiles' && <PmtilesBasemap url={meta.data!.basemapPmtilesUrl!} onReady={setReady} />}
        {source === 'offline' && <OfflineBasemap onReady={setReady} />}
        {source === 'offline' && <TownLabels />}
        {children}
      </MapContainer>
    </div>
  )
}

function tileHost(url: string): string {
  return url.replace(/^[a-z]+:\/\//i, '').split('/')[0]
}

/** The vector basemap's code is fetched only by installations that have a PMTiles file. */
function PmtilesBasemap({ url, onReady }: { url: string; onReady: (ready: boolean) => void }) {
  const map = useMap()
  const [failed, setFailed] = useState(false)
  useEffect(() => {
    let layer: GridLayer | undefined
    let gone = false
    import('./pmtiles-layer')
      .then(({ pmtilesLayer }) => pmtilesLayer(url))
      .then((made) => {
        if (gone) return
        layer = made.layer
        layer.on('load', () => onReady(true))
        layer.setZIndex(1).addTo(map)
      })
      .catch(() => !gone && setFailed(true))
    return () => {
      gone = true
      layer?.remove()
    }
  }, [map, url, onReady])
  return failed ? <MapProblem>The map could not be loaded. Pins still show where studios are.</MapProblem> : null
}

function MapProblem({ children }: { children: ReactNode }) {
  return (
    <p
      role="status"
      className="absolute inset-x-3 bottom-3 z-[1000] rounded-control border border-ember-300 bg-ember-100 px-3 py-2 text-sm text-ember-700"
    >
      {children}
    </p>
  )
}

/** MapContainer reads center and zoom once; later changes of the props move the map. */
function FollowView({ center, zoom }: { center: LatLngPair; zoom: number }) {
  const map = useMap()
  const [lat, lng] = center
  useEffect(() => {
    const now = map.getCenter()
    if (Math.abs(now.lat - lat) < 1e-7 && Math.abs(now.lng - lng) < 1e-7 && map.getZoom() === zoom) return
    map.setView([lat, lng], zoom)
  }, [map, lat, lng, zoom])
  return null
}

function MoveEndReporter({ onMoveEnd }: { onMoveEnd: NonNullable<BasemapProps['onMoveEnd']> }) {
  const latest = useRef(onMoveEnd)
  useEffect(() => {
    latest.current = onMoveEnd
  }, [onMoveEnd])
  const map = useMapEvents({
    moveend: () => {
      const b = map.getBounds()
      const c = map.getCenter()
      latest.current({ north: b.getNorth(), south: b.getSouth(), east: b.getEast(), west: b.getWest() }, [c.lat, c.lng], map.getZoom())
    },
  })
  return null
}

/** Cells just out of sight are fetched with the rest, so a small pan does not show bare sea. */
const VIEW_PADDING = 0.25

interface View {
  zoom: number
  bounds: Bounds
}

function viewOf(map: LeafletMap): View {
  const b = map.getBounds().pad(VIEW_PADDING)
  return { zoom: map.getZoom(), bounds: { west: b.getWest(), south: b.getSouth(), east: b.getEast(), north: b.getNorth() } }
}

const cellId = ({ tileset, key }: WantedCell) => `${tileset.id}/${key}`

function OfflineBasemap({ onReady }: { onReady: (ready: boolean) => void }) {
  const map = useMap()
  const [view, setView] = useState<View | null>(null)
  // The first view is taken a frame after the map is made: a page that moves the map as it opens
  // (the search results) then fetches the cells of where it went, not of where it started.
  useEffect(() => {
    const frame = requestAnimationFrame(() => setView(viewOf(map)))
    return () => cancelAnimationFrame(frame)
  }, [map])
  useMapEvents({ moveend: () => setView(viewOf(map)) })

  const wanted = view ? cellsFor(view.zoom, view.bounds) : []
  const cells = useQueries({
    queries: wanted.map((cell) => ({
      queryKey: ['basemap', cell.tileset.id, cell.key],
      queryFn: () => loadCell(cell),
      staleTime: Infinity,
      gcTime: 10 * 60_000,
      retry: 1,
    })),
  })
  const loaded = wanted.flatMap((cell, i) => (cells[i].data ? [{ id: cellId(cell), shapes: cells[i].data }] : []))
  const drawn = view !== null && cells.every((c) => !c.isPending)

  // Until the cells of a new view are in, the last view drawn whole stays under them (its cells
  // are still in the query cache), so zooming across a level of detail does not flash bare sea.
  const queryClient = useQueryClient()
  const [settled, setSettled] = useState<View | null>(null)
  useEffect(() => {
    if (drawn) setSettled(view)
  }, [drawn, view])
  const held =
    drawn || !settled
      ? []
      : cellsFor(settled.zoom, settled.bounds).flatMap((cell) => {
          const shapes = queryClient.getQueryData<CellShapes>(['basemap', cell.tileset.id, cell.key])
          return shapes && !loaded.some((c) => c.id === cellId(cell)) ? [{ id: cellId(cell), shapes }] : []
        })
  const shown = [...held, ...loaded]

  useEffect(() => {
    onReady(drawn)
  }, [drawn, onReady])

  return (
    <>
      {/* Below markers and overlays, where tiles would sit. */}
      {LAYER_ORDER.map((layer, i) => (
        <Pane key={layer} name={`basemap-${layer}`} style={{ zIndex: 200 + i }}>
          {shown.map(
            (cell) =>
              cell.shapes[layer] && (
                <GeoJSON
                  key={cell.id}
                  data={cell.shapes[layer]}
                  style={LAYER_STYLES[layer] ?? OTHER_LAYER}
                  interactive={false}
                  attribution={OFFLINE_ATTRIBUTION}
                />
              ),
          )}
        </Pane>
      ))}
      {cells.some((c) => c.isError) && <MapProblem>The map outline could not be loaded. Pins still show where studios are.</MapProblem>}
    </>
  )
}
