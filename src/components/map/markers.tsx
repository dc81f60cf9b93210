import 'react-leaflet-cluster/dist/assets/MarkerCluster.css'
import L from 'leaflet'
import type { ReactNode } from 'react'
import { Marker } from 'react-leaflet'
import MarkerClusterGroup from 'react-leaflet-cluster'
import type { LatLngPair } from './Basemap'

// Our own pins, drawn as inline SVG in divIcons: Leaflet's default icons are PNGs whose URLs break
// under a bundler, and they are not ours.

const PIN_PATH = 'M12 0C5.4 0 0 5.2 0 11.7 0 20.4 12 32 12 32s12-11.6 12-20.3C24 5.2 18.6 0 12 0z'

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

export interface StudioIconOptions {
  selected?: boolean
  /** A short tag beside the pin: the studio's name, a price, space left. */
  label?: string
}

// react-leaflet replaces a marker's element whenever its icon object changes, which loses focus;
// the same options always give the same icon.
const iconCache = new Map<string, L.DivIcon>()

export function studioIcon({ selected = false, label }: StudioIconOptions = {}): L.DivIcon {
  const key = `${selected ? 1 : 0}|${label ?? ''}`
  const cached = iconCache.get(key)
  if (cached) return cached
  const [width, height] = selected ? [32, 42] : [24, 32]
  const fill = selected ? 'fill-celadon-700' : 'fill-clay-600'
  const tag = label
    ? `<span class="absolute left-full top-0.5 ml-1 whitespace-nowrap rounded-control px-1.5 py-0.5 text-xs font-semibold shadow-card ${
        selected ? 'bg-celadon-700 text-white' : 'bg-white text-slip-900'
      }">${escapeHtml(label)}</span>`
    : ''
  const icon = L.divIcon({
    className: '',
    html:
      `<span class="relative block" style="width:${width}px;height:${height}px">` +
      `<svg viewBox="0 0 24 32" width="${width}" height="${height}" aria-hidden="true" class="block drop-shadow-sm">` +
      `<path d="${PIN_PATH}" class="${fill} stroke-white" stroke-width="1.5"/>` +
      `<circle cx="12" cy="11.7" r="4.2" class="fill-white"/></svg>${tag}</span>`,
    iconSize: [width, height],
    // The tip of the pin is the place.
    iconAnchor: [width / 2, height],
    popupAnchor: [0, -height],
    tooltipAnchor: [width / 2, -height / 2],
  })
  iconCache.set(key, icon)
  return icon
}

export interface StudioMarkerProps {
  position: LatLngPair
  /** Read out by screen readers and shown on hover. */
  title: string
  label?: string
  selected?: boolean
  onSelect?: () => void
  draggable?: boolean
  children?: ReactNode
}

/** One studio on the map; Enter on a focused pin selects it as a click does (Leaflet's keyboard handling). */
export function StudioMarker({ position, title, label, selected = false, onSelect, draggable = false, children }: StudioMarkerProps) {
  return (
    <Marker
      position={position}
      title={title}
      alt={title}
      icon={studioIcon({ selected, label })}
      zIndexOffset={selected ? 1000 : 0}
      draggable={draggable}
      keyboard
      eventHandlers={onSelect ? { click: onSelect } : undefined}
    >
      {children}
    </Marker>
  )
}

interface Cluster {
  getChildCount(): number
}

function clusterIcon(cluster: Cluster): L.DivIcon {
  const count = cluster.getChildCount()
  const size = count < 10 ? 34 : count < 100 ? 40 : 48
  return L.divIcon({
    className: '',
    html:
      `<span class="flex size-full items-center justify-center rounded-full border-2 border-white bg-clay-700 text-sm font-bold text-white shadow-card ring-4 ring-clay-200/70">` +
      `${count}<span class="sr-only"> studios here; zoom in to see them</span></span>`,
    iconSize: L.point(size, size),
  })
}

export interface ClusteredMarkersProps {
  children: ReactNode
  /** How close, in screen pixels, pins must be to share a cluster. */
  maxClusterRadius?: number
}

/** Groups nearby pins into numbered clusters that split as the map zooms in. */
export function ClusteredMarkers({ children, maxClusterRadius = 48 }: ClusteredMarkersProps) {
  return (
    <MarkerClusterGroup
      chunkedLoading
      showCoverageOnHover={false}
      spiderfyOnMaxZoom
      maxClusterRadius={maxClusterRadius}
      iconCreateFunction={clusterIcon}
    >
      {children}
    </MarkerClusterGroup>
  )
}
