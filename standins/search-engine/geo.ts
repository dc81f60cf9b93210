// Geo distance as the engine computes it: milli `distance_between_two_points` calls the geoutils
// crate's haversine formula on a sphere of mean radius 6,371,000 m and rounds to the millimetre.

export const EARTH_RADIUS_M = 6_371_000

const RADIANS_PER_DEGREE = Math.PI / 180

/** Great-circle distance in metres between two points given in degrees. */
export function haversineMetres(aLat: number, aLng: number, bLat: number, bLng: number): number {
  const phi1 = aLat * RADIANS_PER_DEGREE
  const phi2 = bLat * RADIANS_PER_DEGREE
  const total = (1 - Math.cos(phi2 - phi1)) / 2 + Math.cos(phi1) * Math.cos(phi2) * ((1 - Math.cos((bLng - aLng) * RADIANS_PER_DEGREE)) / 2)
  return Math.round(2 * EARTH_RADIUS_M * Math.asin(Math.sqrt(total)) * 1000) / 1000
}

export interface GeoPoint {
  lat: number
  lng: number
}

interface LatitudeOrder {
  lats: Float64Array
  lngs: Float64Array
  ids: Int32Array
}

/**
 * Points kept in latitude order, so a radius or box query only measures the points inside its
 * latitude band instead of every document.
 */
export class GeoIndex {
  private readonly points = new Map<number, GeoPoint>()
  private order: LatitudeOrder | null = null

  set(id: number, lat: number, lng: number): void {
    this.points.set(id, { lat, lng })
    this.order = null
  }

  delete(id: number): void {
    if (this.points.delete(id)) this.order = null
  }

  get(id: number): GeoPoint | undefined {
    return this.points.get(id)
  }

  private byLatitude(): LatitudeOrder {
    if (!this.order) {
      const entries = [...this.points.entries()].sort((a, b) => a[1].lat - b[1].lat)
      this.order = {
        lats: Float64Array.from(entries, ([, point]) => point.lat),
        lngs: Float64Array.from(entries, ([, point]) => point.lng),
        ids: Int32Array.from(entries, ([id]) => id),
      }
    }
    return this.order
  }

  private bandStart(lats: Float64Array, south: number): number {
    let low = 0
    let high = lats.length
    while (low < high) {
      const middle = (low + high) >>> 1
      if (lats[middle] < south) low = middle + 1
      else high = middle
    }
    return low
  }

  /** Ids within `radius` metres of the centre, with the engine's `<= radius + EPSILON`. */
  withinRadius(lat: number, lng: number, radius: number): number[] {
    const { lats, lngs, ids } = this.byLatitude()
    const bandDegrees = radius / EARTH_RADIUS_M / RADIANS_PER_DEGREE + 1e-9
    const north = lat + bandDegrees
    const found: number[] = []
    for (let i = this.bandStart(lats, lat - bandDegrees); i < lats.length && lats[i] <= north; i++) {
      if (haversineMetres(lat, lng, lats[i], lngs[i]) <= radius + Number.EPSILON) found.push(ids[i])
    }
    return found
  }

  /** Ids inside a box; a box whose east edge is west of its west edge wraps the antimeridian. */
  withinBox(north: number, east: number, south: number, west: number): number[] {
    const { lats, lngs, ids } = this.byLatitude()
    const wraps = east < west
    const found: number[] = []
    for (let i = this.bandStart(lats, south); i < lats.length && lats[i] <= north; i++) {
      const lngValue = lngs[i]
      if (wraps ? lngValue >= west || lngValue <= east : lngValue >= west && lngValue <= east) found.push(ids[i])
    }
    return found
  }
}
