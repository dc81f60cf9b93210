import { z } from 'zod'
import { text } from './text'
import { FIRING_KINDS } from '../firing/check'
import { coneIndex, parseCone } from '../firing/cones'

const number = (what: string, min: number, max: number) =>
  z.coerce
    .number({ error: `Enter the ${what} as a number.` })
    .min(min, `The ${what} must be at least ${min}.`)
    .max(max, `The ${what} can be at most ${max}.`)

const conePart = (value: string) => {
  const parsed = parseCone(value.trim())
  return parsed.ok ? coneIndex(parsed.cone) : null
}

/** "6", "^6", "cone 04", or a range "04..6". */
export const coneFilterSchema = text()
  .transform((value, ctx) => {
    const [a, b] = value.split('..')
    const low = conePart(a)
    const high = b === undefined ? low : conePart(b)
    if (low === null || high === null) {
      ctx.addIssue({ code: 'custom', message: 'Enter a cone like 6 or 04, or a range like 04..6.' })
      return z.NEVER
    }
    if (low > high) {
      ctx.addIssue({ code: 'custom', message: 'Put the cooler cone first, like 04..6.' })
      return z.NEVER
    }
    return { minRank: low, maxRank: high }
  })
  .meta({ examples: ['6', '04..6', '^10'] })

const day = text()
  .refine((s) => !Number.isNaN(Date.parse(s)), 'Enter a date like 2027-03-05.')
  .transform((s) => new Date(/^\d{4}-\d{2}-\d{2}$/.test(s) ? `${s}T00:00:00Z` : s))

/** How far a search reaches around a place when the potter does not say. */
export const DEFAULT_RADIUS_KM = 80

export const SEARCH_SORTS = ['distance', 'price', 'soonest', 'rating'] as const

export const searchQuerySchema = z
  .object({
    near: text()
      .regex(/^\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*$/, 'Give near as latitude,longitude, like 45.52,-122.68.')
      .transform((s) => s.split(',').map(Number) as [number, number])
      .refine(([lat, lng]) => Math.abs(lat) <= 90 && Math.abs(lng) <= 180, 'That point is not on the map.')
      .optional(),
    place: text()
      .trim()
      .min(2, 'Enter a town or a postal code.')
      .max(120)
      .meta({ examples: ['Portland, OR', '97214', 'V6B'] })
      .optional(),
    radiusKm: number('distance', 1, 2000).optional(),
    cone: coneFilterSchema.optional(),
    atmosphere: z.enum(['oxidation', 'reduction', 'neutral'], { error: 'Choose oxidation, reduction or neutral.' }).optional(),
    kind: z.enum(FIRING_KINDS, { error: 'Choose bisque, glaze, single, lustre or raku.' }).optional(),
    from: day.optional(),
    to: day.optional(),
    fitsHeightMm: number('height', 1, 3000).optional(),
    fitsWidthMm: number('width', 1, 3000).optional(),
    fitsDepthMm: number('depth', 1, 3000).optional(),
    q: text().trim().max(100, 'Keep the words under 100 characters.').optional(),
    sort: z.enum(SEARCH_SORTS, { error: 'Sort by distance, price, soonest or rating.' }).optional(),
    page: z.coerce.number().int('Pages are whole numbers.').min(1, 'Pages start at 1.').max(250).default(1),
    perPage: z.coerce.number().int().min(1).max(50, 'At most 50 per page.').default(20),
  })
  .superRefine((q, ctx) => {
    if (q.near && q.place) ctx.addIssue({ code: 'custom', path: ['place'], message: 'Give a place or a point, not both.' })
    if (q.sort === 'distance' && !q.near && !q.place)
      ctx.addIssue({ code: 'custom', path: ['sort'], message: 'Sorting by distance needs a place to measure from.' })
    if (q.radiusKm !== undefined && !q.near && !q.place)
      ctx.addIssue({ code: 'custom', path: ['radiusKm'], message: 'A distance needs a place to measure from.' })
    if (q.fitsDepthMm !== undefined && q.fitsWidthMm === undefined)
      ctx.addIssue({ code: 'custom', path: ['fitsWidthMm'], message: 'Give the width too.' })
    if (q.from && q.to && q.from > q.to)
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'The end of the window must come after its start.' })
  })
export type SearchQuery = z.output<typeof searchQuerySchema>

export interface SearchHit {
  firingId: string
  studio: { id: string; name: string; lat: number; lng: number; city: string; region: string; verified: boolean }
  kiln: {
    id: string
    name: string
    kind: string
    minCone: string
    maxCone: string
    atmospheres: string[]
    usableHeightMm: number
    shelf: { shape: 'round' | 'box'; diameterMm: number | null; widthMm: number | null; depthMm: number | null }
  }
  cone: string
  atmosphere: string
  kind: string
  dropOffBy: string
  firingDate: string
  readyBy: string
  /** The load plan's room: shelves free for short ware, all its shelves, and the tallest piece it takes. */
  space: { shelvesLeft: number; shelvesTotal: number; tallestMm: number }
  distanceKm: number | null
  priceExample: { label: string; totalCents: number; currency: string } | null
  /** Published answers from potters: how many, and how many would fire there again. */
  reviews: { fireAgain: number; count: number } | null
}

export interface SearchResponse {
  hits: SearchHit[]
  total: number
  page: number
  perPage: number
  degraded: boolean
  origin: { lat: number; lng: number; label: string } | null
  facets: Record<string, Record<string, number>>
}
