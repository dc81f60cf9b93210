import type { Map as LeafletMap, Marker as LeafletMarker } from 'leaflet'
import { useEffect, useId, useRef, useState } from 'react'
import { Marker, useMapEvents } from 'react-leaflet'
import { Button } from '../ui/Button'
import { Basemap } from './Basemap'
import { studioIcon } from './markers'

export interface LatLng {
  lat: number
  lng: number
}

export interface PinPickerProps {
  value: LatLng
  onChange: (position: LatLng) => void
  zoom?: number
  /** Sizes the map, e.g. "h-72". */
  className?: string
}

/** Screen pixels one press of a nudge button moves the pin, at whatever zoom the map shows. */
const NUDGE_PX = 8

// A millionth of a degree is about 0.1 m: finer than anyone can place a pin.
const round6 = (degrees: number) => Math.round(degrees * 1e6) / 1e6
const same = (a: LatLng, b: LatLng) => a.lat === b.lat && a.lng === b.lng

function ClickToPlace({ onPlace }: { onPlace: (p: LatLng) => void }) {
  useMapEvents({ click: (e) => onPlace({ lat: round6(e.latlng.lat), lng: round6(e.latlng.lng) }) })
  return null
}

function formatPosition({ lat, lng }: LatLng): string {
  return `${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lng).toFixed(5)}° ${lng >= 0 ? 'E' : 'W'}`
}

/**
 * A map with one pin the studio owner drags (or clicks, or nudges with the buttons) to where the studio is.
 * The map follows `value` when it changes from outside, not while the pin is being moved here.
 */
export function PinPicker({ value, onChange, zoom = 15, className = 'h-72' }: PinPickerProps) {
  const mapRef = useRef<LeafletMap | null>(null)
  const placedHere = useRef<LatLng | null>(null)
  const [view, setView] = useState<LatLng>(value)
  const hintId = useId()

  useEffect(() => {
    if (placedHere.current && same(placedHere.current, value)) return
    setView(value)
  }, [value])

  const place = (position: LatLng) => {
    placedHere.current = position
    onChange(position)
  }

  const nudge = (dx: number, dy: number) => {
    const map = mapRef.current
    if (!map) return
    const z = map.getZoom()
    const moved = map.unproject(map.project([value.lat, value.lng], z).add([dx * NUDGE_PX, dy * NUDGE_PX]), z)
    if (!map.getBounds().pad(-0.15).contains(moved)) map.panTo(moved)
    place({ lat: round6(moved.lat), lng: round6(moved.lng) })
  }

  return (
    <div className="space-y-2">
      <Basemap
        ref={mapRef}
        center={[view.lat, view.lng]}
        zoom={zoom}
        className={`rounded-card border border-slip-200 ${className}`}
        label="Studio location"
      >
        <Marker
          position={[value.lat, value.lng]}
          icon={studioIcon({ selected: true })}
          draggable
          keyboard
          title="Studio location"
          alt="Studio location"
          eventHandlers={{
            dragend: (e) => {
              const at = (e.target as LeafletMarker).getLatLng()
              place({ lat: round6(at.lat), lng: round6(at.lng) })
            },
          }}
        />
        <ClickToPlace onPlace={place} />
      </Basemap>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p id={hintId} className="text-sm text-slip-600">
          Drag the pin to where the studio is, or click the map. The arrows move it a little at a time.
        </p>
        <div role="group" aria-label="Move the pin" aria-describedby={hintId} className="flex gap-1">
          <Button variant="secondary" size="sm" aria-label="Move the pin north" onClick={() => nudge(0, -1)}>
            ↑
          </Button>
          <Button variant="secondary" size="sm" aria-label="Move the pin south" onClick={() => nudge(0, 1)}>
            ↓
          </Button>
          <Button variant="secondary" size="sm" aria-label="Move the pin west" onClick={() => nudge(-1, 0)}>
            ←
          </Button>
          <Button variant="secondary" size="sm" aria-label="Move the pin east" onClick={() => nudge(1, 0)}>
            →
          </Button>
        </div>
      </div>
      <p className="text-xs text-slip-500" aria-live="polite">
        Pin at {formatPosition(value)}
      </p>
    </div>
  )
}
