import { Basemap, type LatLngPair } from './Basemap'
import { StudioMarker } from './markers'

export interface PlaceMapProps {
  position: LatLngPair
  /** The pin's name, shown beside it and read out. */
  title: string
  zoom?: number
  label?: string
  className?: string
}

/** One place on a basemap, its pin named: where a studio is. Pages load it lazily, with Leaflet. */
export function PlaceMap({ position, title, zoom = 12, label, className }: PlaceMapProps) {
  return (
    <Basemap center={position} zoom={zoom} className={className} label={label}>
      <StudioMarker position={position} title={title} label={title} selected />
    </Basemap>
  )
}
