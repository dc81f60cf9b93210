import type { SearchHit, SearchResponse } from '../../../shared/schemas/search'
import type { LatLngPair } from '../../components/map/Basemap'

// What the results map is given, apart from the map itself so the page can work these out while
// the map's code (Leaflet) is still on its way.

export interface MapStudio {
  id: string
  name: string
  position: LatLngPair
}

/** One pin per studio: a studio's firings all stand at the same place. */
export function studiosOf(hits: readonly SearchHit[]): MapStudio[] {
  const seen = new Map<string, MapStudio>()
  for (const hit of hits) {
    if (!seen.has(hit.studio.id))
      seen.set(hit.studio.id, { id: hit.studio.id, name: hit.studio.name, position: [hit.studio.lat, hit.studio.lng] })
  }
  return [...seen.values()]
}

/** The view a set of results is shown in: the searched place and the studios found around it. */
export interface MapFit {
  /** Changes when the map should go somewhere else (a new place or distance), not for a new cone: `whereKey`. */
  key: string
  origin: SearchResponse['origin']
  radiusKm: number | null
  studios: MapStudio[]
}

export interface AreaSearch {
  near: string
  radiusKm: string
}
