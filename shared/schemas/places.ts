import { z } from 'zod'
import { text } from './text'

/** A place the offline gazetteer knows: a ZIP code, a Canadian postal district or a town. */
export interface Place {
  label: string
  lat: number
  lng: number
  postalCode: string | null
  city: string
  region: string
  country: 'US' | 'CA'
  timezone: string
}

export const PLACE_QUERY_MAX = 120

export const placesQuerySchema = z.object({
  q: text({ error: 'Type a town, a ZIP code or a postal code.' })
    .trim()
    .min(1, 'Type a town, a ZIP code or a postal code.')
    .max(PLACE_QUERY_MAX, `Keep the place under ${PLACE_QUERY_MAX} characters.`)
    .meta({ examples: ['Portland', '972', 'V6B 1A1'] }),
  limit: z.coerce
    .number({ error: 'The number of places must be a whole number.' })
    .int('The number of places must be a whole number.')
    .min(1, 'Ask for at least one place.')
    .max(20, 'Ask for at most 20 places.')
    .optional(),
})
export type PlacesQuery = z.infer<typeof placesQuerySchema>

/** A town to name on a map: the gazetteer's centre of its postal codes, and how many it has (its size). */
export interface TownLabel {
  name: string
  region: string
  lat: number
  lng: number
  postalCount: number
}

const degrees = (what: string, limit: number) =>
  z.coerce
    .number({ error: `Give the ${what} edge in degrees.` })
    .min(-limit, `The ${what} edge must be at least -${limit}.`)
    .max(limit, `The ${what} edge can be at most ${limit}.`)

/** The part of the map in view and its zoom: which towns to name there. */
export const townsQuerySchema = z
  .object({
    west: degrees('west', 180),
    south: degrees('south', 90),
    east: degrees('east', 180),
    north: degrees('north', 90),
    zoom: z.coerce.number({ error: 'Give the zoom as a number.' }).int('The zoom is a whole number.').min(0).max(22),
  })
  .superRefine((q, ctx) => {
    if (q.south > q.north) ctx.addIssue({ code: 'custom', path: ['north'], message: 'The north edge must lie north of the south edge.' })
    if (q.west > q.east) ctx.addIssue({ code: 'custom', path: ['east'], message: 'The east edge must lie east of the west edge.' })
  })
export type TownsQuery = z.infer<typeof townsQuerySchema>
