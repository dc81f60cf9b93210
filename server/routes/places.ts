import { Router } from 'express'
import { placesQuerySchema, townsQuerySchema, type PlacesQuery, type TownsQuery } from '../../shared/schemas/places'
import { openRouteLimiter } from '../auth/rate-limit'
import type { AppContext } from '../context'
import { validateQuery } from '../http/validate'
import { lookupPlace, searchPlaces, townsToName, type Place } from '../services/gazetteer'

export function placesRouter(ctx: AppContext) {
  const router = Router()
  const perIp = openRouteLimiter(ctx.config.rateLimits.openApiPerIpPerMin)

  // Open: the studio form and the search box both look places up before anyone signs in.
  router.get('/places', perIp, validateQuery(placesQuerySchema), (_req, res) => {
    const { q, limit = 8 } = res.locals.query as PlacesQuery
    // A whole address or postcode resolves to one place; what follows are completions of the prefix.
    const places = new Map<string, Place>()
    for (const place of [lookupPlace(q), ...searchPlaces(q, limit)]) {
      if (place && !places.has(place.label)) places.set(place.label, place)
    }
    res.json({ places: [...places.values()].slice(0, limit) })
  })

  // Town names for the offline map: the towns in view, biggest first; the map keeps those that fit.
  router.get('/places/towns', perIp, validateQuery(townsQuerySchema), (_req, res) => {
    const { zoom, ...bounds } = res.locals.query as TownsQuery
    res.json({ towns: townsToName(bounds, zoom) })
  })

  return router
}
