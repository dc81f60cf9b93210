import 'leaflet/dist/leaflet.css'
import { useQuery } from '@tanstack/react-query'
import type { Map as LeafletMap, PathOptions } from 'leaflet'
import { useEffect, useRef, useState, type ReactNode, type Ref } from 'react'
import { GeoJSON, MapContainer, Pane, TileLayer, useMap, useMapEvents } from 'react-leaflet'
import { useSiteMeta } from '../../lib/meta'
import { loadCountyLayers, loadUsLayers, loadWorldLayers } from './offline-layers'

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

export const OFFLINE_ATTRIBUTION = 'Map data: Natural Earth, U.S. Census Bureau'

/** Counties appear from this zoom on; further out they are a grey blur. */
export const COUNTY_MIN_ZOOM = 8

// Colours come from the design tokens through Tailwind classes on the SVG paths; the stroke and
// fill attributes Leaflet writes lose to any stylesheet rule.
const landStyle: PathOptions = { className: 'fill-slip-100 stroke-water-300', weight: 1, fillOpacity: 1 }
const borderStyle: PathOptions = { className: 'stroke-slip-400', weight: 1, fill: false }
const stateStyle: PathOptions = { className: 'stroke-slip-300', weight: 1, dashArray: '4 3', fill: false }
const countyStyle: PathOptions = { className: 'stroke-slip-200', weight: 0.75, fill: false }

/**
 * A map: tiles from `TILE_URL` when the installation has a tile server, otherwise land, borders,
 * US states and (zoomed in) counties drawn from TopoJSON shipped with the app. Nothing is fetched
 * from outside our own origin. The wrapper carries `data-testid="basemap"` and, once the basemap
 * is drawn, `data-basemap-ready="true"`.
 */
export function Basemap({ center, zoom, className = 'h-96', label = 'Map', onMoveEnd, children, ref }: BasemapProps) {
  const meta = useSiteMeta()
  const [ready, setReady] = useState(false)
  const tileUrl = meta.isPending ? undefined : (meta.data?.tileUrl ?? null)
  const source = tileUrl === undefined ? 'pending' : tileUrl ? 'tiles' : 'offline'

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
        maxZoom={tileUrl ? 18 : 16}
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
        {source === 'offline' && <OfflineBasemap onReady={setReady} />}
        {children}
      </MapContainer>
    </div>
  )
}

function tileHost(url: string): string {
  return url.replace(/^[a-z]+:\/\//i, '').split('/')[0]
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

const forever = { staleTime: Infinity, gcTime: Infinity, retry: 1 } as const

function OfflineBasemap({ onReady }: { onReady: (ready: boolean) => void }) {
  const map = useMap()
  const [zoom, setZoom] = useState(() => map.getZoom())
  useMapEvents({ zoomend: () => setZoom(map.getZoom()) })

  const world = useQuery({ queryKey: ['basemap', 'world'], queryFn: loadWorldLayers, ...forever })
  const us = useQuery({ queryKey: ['basemap', 'us-states'], queryFn: loadUsLayers, ...forever })
  const counties = useQuery({
    queryKey: ['basemap', 'us-counties'],
    queryFn: loadCountyLayers,
    enabled: zoom >= COUNTY_MIN_ZOOM,
    ...forever,
  })

  const drawn = Boolean(world.data && us.data)
  useEffect(() => {
    onReady(drawn)
  }, [drawn, onReady])

  return (
    <>
      {/* Below markers and overlays, where tiles would sit. */}
      <Pane name="basemap" style={{ zIndex: 200 }}>
        {world.data && (
          <>
            <GeoJSON data={world.data.land} style={landStyle} interactive={false} attribution={OFFLINE_ATTRIBUTION} />
            <GeoJSON data={world.data.borders} style={borderStyle} interactive={false} />
          </>
        )}
        {us.data && <GeoJSON data={us.data.states} style={stateStyle} interactive={false} />}
        {counties.data && zoom >= COUNTY_MIN_ZOOM && <GeoJSON data={counties.data.counties} style={countyStyle} interactive={false} />}
      </Pane>
      {(world.isError || us.isError) && (
        <p
          role="status"
          className="absolute inset-x-3 bottom-3 z-[1000] rounded-control border border-ember-300 bg-ember-100 px-3 py-2 text-sm text-ember-700"
        >
          The map outline could not be loaded. Pins still show where studios are.
        </p>
      )}
    </>
  )
}
