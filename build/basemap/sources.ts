import type { Feature, FeatureCollection, MultiLineString, MultiPolygon, Polygon as GeoPolygon } from 'geojson'
import { createRequire } from 'node:module'
import { readFileSync } from 'node:fs'
import { feature, mesh } from 'topojson-client'
import { filter, filterWeight, planarRingArea, presimplify, simplify } from 'topojson-simplify'
import type { GeometryCollection, GeometryObject, Topology } from 'topojson-specification'
import type { Line, Polygon } from './geometry.ts'

// The shapes the basemap is made from: TopoJSON shipped by registry packages, simplified for the
// zoom a tileset is drawn at. world-atlas is Natural Earth (public domain) at 1:50m and 1:10m;
// us-atlas is the U.S. Census Bureau's cartographic boundaries (public domain).

const require = createRequire(import.meta.url)

type WorldObjects = { land: GeometryCollection; countries: GeometryCollection }
type StateObjects = { states: GeometryCollection }
type CountyObjects = { counties: GeometryCollection }

type SimplifyTopology = Parameters<typeof presimplify>[0]

/** The size of a screen pixel in degrees of longitude at a zoom (256-pixel Web Mercator tiles). */
export function pixelDegrees(zoom: number) {
  return 360 / (256 * 2 ** zoom)
}

/**
 * A topology simplified for a zoom (Visvalingam, planar areas in square degrees): a point goes when
 * the triangle it makes with its neighbours is under one square pixel there (it moves a line by
 * less than half a pixel over four), and a ring (an islet, a lake) goes when it covers less than
 * four square pixels.
 */
export function simplifiedFor<T extends Record<string, GeometryObject>>(topology: Topology<T>, zoom: number): Topology<T> {
  const pixel = pixelDegrees(zoom)
  const weighed = presimplify(topology as unknown as SimplifyTopology)
  const filtered = filter(weighed, filterWeight(weighed, 4 * pixel * pixel, planarRingArea)) as unknown as SimplifyTopology
  return simplify(filtered, pixel * pixel) as unknown as Topology<T>
}

function readTopology<T extends Record<string, GeometryObject>>(specifier: string): Topology<T> {
  return JSON.parse(readFileSync(require.resolve(specifier), 'utf8')) as Topology<T>
}

const polygonsOf = (geometry: GeoPolygon | MultiPolygon | null): Polygon[] =>
  !geometry ? [] : geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates

/** Reads each source file once and each simplification once, whatever number of layers asks. */
export class Sources {
  private files = new Map<string, Topology<Record<string, GeometryObject>>>()
  private simplified = new Map<string, Topology<Record<string, GeometryObject>>>()

  private at<T extends Record<string, GeometryObject>>(specifier: string, zoom: number): Topology<T> {
    const key = `${specifier}@${zoom}`
    let topology = this.simplified.get(key)
    if (!topology) {
      let file = this.files.get(specifier)
      if (!file) this.files.set(specifier, (file = readTopology(specifier)))
      topology = simplifiedFor(file, zoom)
      this.simplified.set(key, topology)
    }
    return topology as unknown as Topology<T>
  }

  /** Natural Earth at the scale that suits the zoom: 1:50m up to zoom 7, 1:10m from 8. */
  private world(zoom: number) {
    return this.at<WorldObjects>(zoom >= 8 ? 'world-atlas/countries-10m.json' : 'world-atlas/countries-50m.json', zoom)
  }

  land(zoom: number): Polygon[] {
    const world = this.world(zoom)
    const land: Feature | FeatureCollection = feature(world, world.objects.land)
    const geometries = 'features' in land ? land.features.map((f) => f.geometry) : [(land as Feature).geometry]
    return geometries.flatMap((g) => polygonsOf(g as GeoPolygon | MultiPolygon))
  }

  /** The land's outline: every arc of the land, once. */
  coast(zoom: number): Line[] {
    const world = this.world(zoom)
    return linesOf(mesh(world, world.objects.land))
  }

  /** Arcs shared by two countries. */
  borders(zoom: number): Line[] {
    const world = this.world(zoom)
    return linesOf(mesh(world, world.objects.countries, (a, b) => a !== b))
  }

  /** Lines between two US states (the coast is the land's). */
  usStates(zoom: number): Line[] {
    const us = this.at<StateObjects>('us-atlas/states-10m.json', zoom)
    return linesOf(mesh(us, us.objects.states, (a, b) => a !== b))
  }

  /** Lines between two counties of the same state (county FIPS codes start with the state's two digits). */
  usCounties(zoom: number): Line[] {
    const us = this.at<CountyObjects>('us-atlas/counties-10m.json', zoom)
    const stateOf = (county: GeometryObject) => String(county.id).slice(0, 2)
    return linesOf(mesh(us, us.objects.counties, (a, b) => a !== b && stateOf(a) === stateOf(b)))
  }
}

const linesOf = (lines: MultiLineString): Line[] => lines.coordinates
