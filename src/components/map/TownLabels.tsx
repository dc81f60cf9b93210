import { useQuery } from '@tanstack/react-query'
import L from 'leaflet'
import { useState } from 'react'
import { Marker, Pane, useMap, useMapEvents } from 'react-leaflet'
import type { TownLabel } from '../../../shared/schemas/places'
import { api } from '../../lib/api'
import { labelBox, placeTownLabels } from './town-labels'

/** Below this zoom the offline map shows a region, and state lines say enough. */
const FIRST_ZOOM = 7

const escapeHtml = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)

const round = (n: number) => Math.round(n * 100) / 100

function townIcon(name: string): L.DivIcon {
  const box = labelBox(name, 0, 0)
  const width = box.right - box.left
  return L.divIcon({
    className: '',
    html: `<span class="block text-center text-xs font-semibold whitespace-nowrap text-slip-700 [text-shadow:0_0_2px_white,0_0_3px_white]">${escapeHtml(name)}</span>`,
    iconSize: [width, 18],
    iconAnchor: [width / 2, 9],
  })
}

/**
 * Town names from our own gazetteer over the offline basemap, at the zooms where they help: the
 * biggest towns in view first, no two names overlapping. Drawn in a pane under the pins.
 */
export function TownLabels() {
  const map = useMap()
  const [view, setView] = useState(() => ({ zoom: map.getZoom(), bounds: map.getBounds() }))
  useMapEvents({ moveend: () => setView({ zoom: map.getZoom(), bounds: map.getBounds() }) })
  const b = view.bounds.pad(0.1)
  const query = {
    west: String(round(Math.max(-180, b.getWest()))),
    south: String(round(Math.max(-90, b.getSouth()))),
    east: String(round(Math.min(180, b.getEast()))),
    north: String(round(Math.min(90, b.getNorth()))),
    zoom: String(view.zoom),
  }
  const shown = view.zoom >= FIRST_ZOOM
  const towns = useQuery({
    queryKey: ['map', 'towns', query],
    queryFn: ({ signal }) =>
      api<{ towns: TownLabel[] }>(`/api/places/towns?${new URLSearchParams(query)}`, { signal }).then((r) => r.towns),
    enabled: shown,
    staleTime: Infinity,
  })
  if (!shown || !towns.data) return null
  const size = map.getSize()
  const placed = placeTownLabels(towns.data, (t) => map.latLngToContainerPoint([t.lat, t.lng]), { width: size.x, height: size.y })
  return (
    <Pane name="town-labels" style={{ zIndex: 450 }}>
      {placed.map(({ town }) => (
        <Marker
          key={`${town.name}|${town.region}`}
          position={[town.lat, town.lng]}
          icon={townIcon(town.name)}
          interactive={false}
          keyboard={false}
          title={town.name}
        />
      ))}
    </Pane>
  )
}
