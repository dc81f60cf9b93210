import { useState } from 'react'
import { Basemap, type LatLngPair, type MapBounds } from './Basemap'
import { ClusteredMarkers, StudioMarker } from './markers'
import { PinPicker, type LatLng } from './PinPicker'

/**
 * The shared map pieces together, for a page that wants to show them: a basemap with a clustered
 * pin that follows the pin picker beside it, and the view the map was last moved to.
 */
export function MapPreview({ start = { lat: 45.5152, lng: -122.6784 } }: { start?: LatLng }) {
  const [pin, setPin] = useState<LatLng>(start)
  const [view, setView] = useState<{ bounds: MapBounds; center: LatLngPair; zoom: number } | null>(null)
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <div className="space-y-2">
        <Basemap
          center={[start.lat, start.lng]}
          zoom={10}
          className="h-72 rounded-card border border-slip-200"
          label="Overview map"
          onMoveEnd={(bounds, center, zoom) => setView({ bounds, center, zoom })}
        >
          <ClusteredMarkers>
            <StudioMarker position={[pin.lat, pin.lng]} title="The studio" label="The studio" selected />
          </ClusteredMarkers>
        </Basemap>
        <p className="text-xs text-slip-500" data-testid="map-preview-view">
          {view ? `Zoom ${view.zoom}, centre ${view.center[0].toFixed(3)}, ${view.center[1].toFixed(3)}` : 'Move the map to see its view.'}
        </p>
      </div>
      <PinPicker value={pin} onChange={setPin} />
    </div>
  )
}
