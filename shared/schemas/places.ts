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
