// One search, two ways of asking: as a Meilisearch filter and sort for the engine, and as SQL for
// the PostgreSQL fallback. Both come from the same FiringSearch, so both paths mean the same thing.

export interface FiringSearch {
  origin: { lat: number; lng: number } | null
  radiusKm: number | null
  cone: { minRank: number; maxRank: number } | null
  atmosphere: string | null
  kind: string | null
  /** Unix seconds: drop-off deadlines in [from, to]; never before `now`. */
  dropOffFrom: number | null
  dropOffTo: number | null
  now: number
  fits: { heightMm: number | null; widthMm: number | null; depthMm: number | null }
  q: string | null
  sort: 'distance' | 'price' | 'soonest' | 'rating'
  page: number
  perPage: number
}

const num = (n: number) => (Number.isInteger(n) ? String(n) : n.toPrecision(17).replace(/0+$/, '').replace(/\.$/, ''))

/**
 * The footprint test of shared/firing/check.ts, as a condition on the shelf stored in the document.
 * One width and no depth means a round piece of that diameter.
 */
export function footprintCondition(widthMm: number, depthMm: number | null): { round: number; box: [number, number][] } {
  const round = depthMm === null
  const depth = round ? widthMm : depthMm
  const across = round ? widthMm : Math.sqrt(widthMm * widthMm + depth * depth)
  return {
    round: across,
    box: [
      [widthMm, depth],
      [depth, widthMm],
    ],
  }
}

export function engineFilter(s: FiringSearch): string[] {
  const filter = [`dropOffByTs > ${Math.max(s.now, (s.dropOffFrom ?? 0) - 1)}`]
  if (s.dropOffTo !== null) filter.push(`dropOffByTs <= ${s.dropOffTo}`)
  if (s.origin && s.radiusKm !== null)
    filter.push(`_geoRadius(${num(s.origin.lat)}, ${num(s.origin.lng)}, ${Math.round(s.radiusKm * 1000)})`)
  if (s.cone) filter.push(`coneRank ${s.cone.minRank} TO ${s.cone.maxRank}`)
  if (s.atmosphere) filter.push(`atmosphere = "${s.atmosphere}"`)
  if (s.kind) filter.push(`kind = "${s.kind}"`)
  // The load plan's room, not the empty kiln's: a full load takes nothing however tall the kiln.
  if (s.fits.heightMm !== null) filter.push(`roomTallestMm >= ${num(s.fits.heightMm)}`)
  if (s.fits.widthMm !== null) {
    const f = footprintCondition(s.fits.widthMm, s.fits.depthMm)
    const box = f.box.map(([w, d]) => `(shelfWidthMm >= ${num(w)} AND shelfDepthMm >= ${num(d)})`).join(' OR ')
    filter.push(`(shelfShape = "round" AND shelfDiameterMm >= ${num(f.round)}) OR (shelfShape = "box" AND (${box}))`)
  }
  return filter
}

export function engineSort(s: FiringSearch): string[] {
  switch (s.sort) {
    case 'distance':
      return [`_geoPoint(${num(s.origin!.lat)}, ${num(s.origin!.lng)}):asc`, 'dropOffByTs:asc']
    case 'price':
      return ['priceExampleCents:asc', 'dropOffByTs:asc']
    case 'rating':
      return ['ratingScore:desc', 'dropOffByTs:asc']
    default:
      return ['dropOffByTs:asc', 'firingDateTs:asc']
  }
}

/** Great-circle distance in km on the 6371 km mean-radius sphere, as the engine measures. */
export function distanceKm(a: { lat: number; lng: number }, b: { lat: number; lng: number }): number {
  const rad = Math.PI / 180
  const dLat = (b.lat - a.lat) * rad
  const dLng = (b.lng - a.lng) * rad
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLng / 2) ** 2
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(h)))
}

export interface SqlQuery {
  /** Conditions on search_documents' own columns. */
  where: string
  params: unknown[]
  /** Haversine metres from the origin as an SQL expression, computed once per row as `dist`. */
  distance: string | null
  /** Conditions on `dist` (the radius), applied to the rows `where` selects. */
  distanceWhere: string | null
  /** Over the selected rows, which carry `dist`. */
  orderBy: string
}

/** Haversine metres on the engine's 6371 km sphere, so both paths cut the radius at the same place. */
function sqlDistance(lat: string, lng: string) {
  return `(2 * 6371000 * asin(least(1, sqrt(power(sin(radians(lat - ${lat}) / 2), 2) + cos(radians(${lat})) * cos(radians(lat)) * power(sin(radians(lng - ${lng}) / 2), 2)))))`
}

/**
 * The same search over search_documents. The earthdistance box (on its 6378.168 km sphere, widened to
 * cover ours) lets the GiST index narrow the rows; the haversine test decides.
 */
export function sqlQuery(s: FiringSearch): SqlQuery {
  const params: unknown[] = []
  const p = (value: unknown) => {
    params.push(value)
    return `$${params.length}`
  }
  const where = [`drop_off_by_ts > ${p(Math.max(s.now, (s.dropOffFrom ?? 0) - 1))}`]
  if (s.dropOffTo !== null) where.push(`drop_off_by_ts <= ${p(s.dropOffTo)}`)
  let distance: string | null = null
  let distanceWhere: string | null = null
  if (s.origin) {
    const lat = `${p(s.origin.lat)}::float8`
    const lng = `${p(s.origin.lng)}::float8`
    distance = sqlDistance(lat, lng)
    if (s.radiusKm !== null) {
      const metres = `${p(s.radiusKm * 1000)}::float8`
      where.push(`earth_box(ll_to_earth(${lat}, ${lng}), ${metres} * 1.0012) @> ll_to_earth(lat, lng)`)
      distanceWhere = `dist <= ${metres}`
    }
  }
  if (s.cone) where.push(`cone_rank BETWEEN ${p(s.cone.minRank)} AND ${p(s.cone.maxRank)}`)
  if (s.atmosphere) where.push(`atmosphere = ${p(s.atmosphere)}`)
  if (s.kind) where.push(`kind = ${p(s.kind)}`)
  if (s.fits.heightMm !== null) where.push(`room_tallest_mm >= ${p(s.fits.heightMm)}`)
  if (s.fits.widthMm !== null) {
    const f = footprintCondition(s.fits.widthMm, s.fits.depthMm)
    const box = f.box.map(([w, d]) => `(shelf_width_mm >= ${p(w)} AND shelf_depth_mm >= ${p(d)})`).join(' OR ')
    where.push(`((shelf_shape = 'round' AND shelf_diameter_mm >= ${p(f.round)}) OR (shelf_shape = 'box' AND (${box})))`)
  }
  if (s.q) {
    for (const word of s.q.split(/\s+/).filter(Boolean).slice(0, 8))
      where.push(`search_text ILIKE ${p(`%${word.replace(/[%_\\]/g, (c) => `\\${c}`)}%`)}`)
  }
  const orderBy =
    s.sort === 'distance'
      ? 'dist ASC, drop_off_by_ts ASC'
      : s.sort === 'price'
        ? 'price_example_cents ASC NULLS LAST, drop_off_by_ts ASC'
        : s.sort === 'rating'
          ? 'rating_score DESC NULLS LAST, drop_off_by_ts ASC'
          : 'drop_off_by_ts ASC, firing_date_ts ASC'
  return { where: where.join(' AND '), params, distance, distanceWhere, orderBy }
}
