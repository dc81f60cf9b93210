import type { Feature, FeatureCollection, MultiLineString } from 'geojson'
import { feature, mesh } from 'topojson-client'
import type { GeometryCollection, GeometryObject, Topology } from 'topojson-specification'
import countiesUrl from 'us-atlas/counties-10m.json?url'
import statesUrl from 'us-atlas/states-10m.json?url'
import countriesUrl from 'world-atlas/countries-50m.json?url'

// The offline basemap's shapes: TopoJSON files shipped by world-atlas (Natural Earth, 1:50m) and
// us-atlas (U.S. Census Bureau cartographic boundaries, 1:10m), served as static files by our own
// server and fetched only when a map is shown, so they stay out of the JavaScript bundle.

export interface WorldLayers {
  land: Feature | FeatureCollection
  borders: MultiLineString
}

export interface UsLayers {
  states: MultiLineString
}

export interface CountyLayers {
  counties: MultiLineString
}

async function fetchTopology<T extends Record<string, GeometryObject>>(url: string): Promise<Topology<T>> {
  const res = await fetch(url, { credentials: 'same-origin' })
  if (!res.ok) throw new Error(`The map outline at ${url} answered ${res.status}.`)
  return (await res.json()) as Topology<T>
}

/** Each file is fetched and converted once per page load, whatever number of maps are shown. */
function once<T>(load: () => Promise<T>): () => Promise<T> {
  let pending: Promise<T> | null = null
  return () => {
    pending ??= load().catch((error: unknown) => {
      pending = null
      throw error
    })
    return pending
  }
}

export const loadWorldLayers = once(async (): Promise<WorldLayers> => {
  const world = await fetchTopology<{ land: GeometryCollection; countries: GeometryCollection }>(countriesUrl)
  return {
    land: feature(world, world.objects.land),
    // Arcs shared by two countries are borders; the coast is the land's own outline.
    borders: mesh(world, world.objects.countries, (a, b) => a !== b),
  }
})

export const loadUsLayers = once(async (): Promise<UsLayers> => {
  const us = await fetchTopology<{ states: GeometryCollection }>(statesUrl)
  return { states: mesh(us, us.objects.states, (a, b) => a !== b) }
})

export const loadCountyLayers = once(async (): Promise<CountyLayers> => {
  const us = await fetchTopology<{ counties: GeometryCollection }>(countiesUrl)
  // County FIPS codes start with the state's two digits; lines between states are drawn already.
  const stateOf = (county: GeometryObject) => String(county.id).slice(0, 2)
  return { counties: mesh(us, us.objects.counties, (a, b) => a !== b && stateOf(a) === stateOf(b)) }
})
