import L, { type Map as LeafletMap } from 'leaflet'
import { useCallback, useEffect, useRef, useState } from 'react'
import { Circle, Marker } from 'react-leaflet'
import type { SearchResponse } from '../../../../shared/schemas/search'
import { Basemap, type LatLngPair } from '../../../components/map/Basemap'
import { conePinIcon, searchCentreIcon } from '../../../components/map/cone-pin'
import { Button } from '../../../components/ui/Button'
import { PIN_MARK_LETTERS, PIN_MARK_WORDS, type AreaSearch, type MapFit, type MapStudio, type PinMark } from '../mapStudios'
import { whereKey } from '../searchState'

/** Where the map opens before the first answer: the lower 48 states. */
const START: { center: LatLngPair; zoom: number } = { center: [39.5, -98.35], zoom: 4 }
const FIT_PADDING: [number, number] = [36, 36]
/** Close enough to see the studios apart, far enough to see what is around them. */
const FIT_MAX_ZOOM = 12
const MAX_RADIUS_KM = 2000

const areaKey = (area: AreaSearch) => whereKey({ near: area.near, radiusKm: area.radiusKm })

interface ResultsMapProps {
  studios: MapStudio[]
  selectedStudioId: string | null
  onSelectStudio: (studioId: string) => void
  /** Set once fresh results are in; the map goes to them when the key changes. */
  fit: MapFit | null
  origin: SearchResponse['origin']
  radiusKm: number | null
  onSearchArea: (area: AreaSearch) => void
  className?: string
}

const pinWords = (studio: MapStudio) =>
  [`${studio.name}: cone ${studio.cones}`, ...studio.marks.map((mark) => PIN_MARK_WORDS[mark])].join(', ')

/**
 * The map panel of the search page: its own toolbar, then the studios found as cone pins around the
 * place searched and its distance ring. Moves the app makes (going to a new search, bringing a chosen
 * studio into view) are made without animation, so they are over by the time the call returns and are
 * told apart from the potter's own: only those let the potter look again where the map now is.
 */
export function ResultsMap({
  studios,
  selectedStudioId,
  onSelectStudio,
  fit,
  origin,
  radiusKm,
  onSearchArea,
  className = '',
}: ResultsMapProps) {
  const mapRef = useRef<LeafletMap | null>(null)
  // The map exists only after its first render; a fit that is already there then waits for it.
  const [map, setMap] = useState<LeafletMap | null>(null)
  const attachMap = useCallback((created: LeafletMap | null) => {
    mapRef.current = created
    setMap(created)
  }, [])
  const moving = useRef(false)
  const fittedKey = useRef<string | null>(null)
  const keepViewFor = useRef<string | null>(null)
  const [movedByHand, setMovedByHand] = useState(false)

  const moveMap = (move: (map: LeafletMap) => void) => {
    const map = mapRef.current
    if (!map) return
    moving.current = true
    try {
      move(map)
    } finally {
      moving.current = false
    }
  }

  useEffect(() => {
    if (!map || !fit || fit.key === fittedKey.current) return
    fittedKey.current = fit.key
    setMovedByHand(false)
    // The potter asked for the area they were looking at: it stays in view as they left it.
    if (keepViewFor.current === fit.key) {
      keepViewFor.current = null
      return
    }
    const points = fit.studios.map((s) => L.latLng(s.position[0], s.position[1]))
    if (fit.origin) points.push(L.latLng(fit.origin.lat, fit.origin.lng))
    if (points.length === 0) return
    let bounds = L.latLngBounds(points)
    if (fit.origin && fit.studios.length === 0 && fit.radiusKm)
      bounds = L.latLng(fit.origin.lat, fit.origin.lng).toBounds(fit.radiusKm * 2000)
    moveMap((map) => {
      if (points.length === 1 && !(fit.origin && fit.studios.length === 0 && fit.radiusKm)) map.setView(points[0], 11, { animate: false })
      else map.fitBounds(bounds, { padding: FIT_PADDING, maxZoom: FIT_MAX_ZOOM, animate: false })
    })
  }, [fit, map])

  useEffect(() => {
    const studio = studios.find((s) => s.id === selectedStudioId)
    if (!studio) return
    moveMap((map) => {
      if (!map.getBounds().contains(studio.position)) map.panTo(studio.position, { animate: false })
    })
  }, [selectedStudioId, studios])

  const searchArea = () => {
    const map = mapRef.current
    if (!map) return
    const center = map.getCenter()
    // Roughly the half-diagonal: the circle through the corners holds everything on screen.
    const km = Math.min(MAX_RADIUS_KM, Math.max(1, center.distanceTo(map.getBounds().getNorthEast()) / 1000))
    const area = { near: `${center.lat.toFixed(4)},${center.lng.toFixed(4)}`, radiusKm: String(Math.round(km * 10) / 10) }
    keepViewFor.current = areaKey(area)
    setMovedByHand(false)
    onSearchArea(area)
  }

  const marks = [...new Set(studios.flatMap((s) => s.marks))] as PinMark[]
  return (
    <section aria-labelledby="map-panel-heading" className="space-y-2" data-testid="map-panel">
      <div className="flex flex-wrap items-center justify-between gap-2 rounded-card border border-slip-200 bg-white px-3 py-2">
        <div className="min-w-0">
          <h2 id="map-panel-heading" className="text-sm font-semibold text-slip-900">
            Map of the studios found
          </h2>
          <p className="text-xs text-slip-600" data-testid="map-legend">
            Each tag is a studio and the cone it fires (<span aria-hidden>∆</span>6 is cone 6)
            {marks.map((mark) => (
              <span key={mark}>
                {' '}
                · <strong className="font-semibold">{PIN_MARK_LETTERS[mark]}</strong> {PIN_MARK_WORDS[mark]}
              </span>
            ))}
            {origin && ' · the ringed dot is where you searched from'}
          </p>
        </div>
        <Button size="sm" variant={movedByHand ? 'primary' : 'secondary'} disabled={!movedByHand} onClick={searchArea}>
          Look for firings in this part of the map
        </Button>
      </div>
      <div className={`relative ${className}`}>
        <Basemap
          ref={attachMap}
          center={START.center}
          zoom={START.zoom}
          label="Map of the studios found"
          className="size-full rounded-card border border-slip-200"
          onMoveEnd={() => {
            if (!moving.current) setMovedByHand(true)
          }}
        >
          {origin && radiusKm && (
            <Circle
              center={[origin.lat, origin.lng]}
              radius={radiusKm * 1000}
              interactive={false}
              // The class is read once, when the path is made; setStyle (pathOptions) never applies it.
              className="stroke-clay-400 fill-clay-200"
              pathOptions={{ weight: 1.5, dashArray: '6 4', fillOpacity: 0.15 }}
            />
          )}
          {origin && (
            <Marker
              position={[origin.lat, origin.lng]}
              icon={searchCentreIcon()}
              title={`Searched from ${origin.label}`}
              alt={`Searched from ${origin.label}`}
              interactive={false}
              keyboard={false}
            />
          )}
          {studios.map((studio) => (
            <Marker
              key={studio.id}
              position={studio.position}
              title={studio.name}
              alt={pinWords(studio)}
              icon={conePinIcon({
                cones: studio.cones,
                marks: studio.marks.map((mark) => PIN_MARK_LETTERS[mark]),
                selected: studio.id === selectedStudioId,
                label: studio.id === selectedStudioId ? studio.name : undefined,
              })}
              zIndexOffset={studio.id === selectedStudioId ? 1000 : 0}
              keyboard
              eventHandlers={{ click: () => onSelectStudio(studio.id) }}
            />
          ))}
        </Basemap>
      </div>
    </section>
  )
}
