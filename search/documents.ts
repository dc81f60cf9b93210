// The mapping from a firing, its kiln and its studio to a search document: one per open upcoming
// firing of a published studio, carrying what a potter filters and sorts on. Pure: the server reads the
// rows and hands them here.
import { shelfFootprint, usableHeightMm, type Atmosphere, type FiringKind, type Kiln as KilnSpec } from '../shared/firing/check'
import type { LoadRoom } from '../shared/firing/load'
import { coneIndex } from '../shared/firing/cones'
import { EXAMPLE_MUG } from '../shared/firing/examples'
import { quoteRequest, type PriceList, type QuoteKiln } from '../shared/firing/quote'

export interface FiringDocument {
  id: string
  studioId: string
  studioName: string
  studioCity: string
  studioRegion: string
  verified: boolean
  kilnId: string
  kilnName: string
  kilnKind: string
  kilnMinCone: string
  kilnMaxCone: string
  kilnAtmospheres: string[]
  cone: string
  coneRank: number
  atmosphere: string
  kind: string
  slowCool: boolean
  dropOffBy: string
  dropOffByTs: number
  firingDate: string
  firingDateTs: number
  readyBy: string
  /** Shelves the load plan has left for short ware, and all it has (shared/firing/load.ts loadRoom). */
  spaceLeftShelves: number
  shelvesTotal: number
  /** The tallest piece the load plan can still take: what "fits my piece" asks of the height. */
  roomTallestMm: number
  usableHeightMm: number
  shelfShape: 'round' | 'box'
  shelfDiameterMm: number | null
  shelfWidthMm: number | null
  shelfDepthMm: number | null
  priceExampleCents: number | null
  priceExampleLabel: string | null
  currency: string
  /** The studio's ranking score from its published answers (shared/reviews fireAgainScore). */
  ratingScore: number | null
  /** Of the potters whose answers are published, how many would fire there again. */
  reviewFireAgain: number
  reviewCount: number
  notes: string
  /** The kiln's price list and what of the kiln a quote reads, so a search can price the potter's own piece. */
  priceList?: PriceList | null
  quoteKiln?: QuoteKiln
  _geo: { lat: number; lng: number }
}

const seconds = (d: Date) => Math.floor(d.getTime() / 1000)

/** What the mapping needs to know of one firing and where it happens. */
export interface FiringFacts {
  studio: { id: string; name: string; city: string; region: string; verified: boolean; lat: number; lng: number; currency: string }
  kiln: { id: string; name: string; kind: string; spec: KilnSpec }
  firing: {
    id: string
    cone: string
    atmosphere: Atmosphere
    kind: string
    slowCool: boolean
    dropOffBy: Date
    firingDate: Date
    readyBy: Date
    notes: string
  }
  /** What the firing's load plan can still take. */
  room: LoadRoom
  priceList: PriceList | null
  reviews: { score: number; fireAgain: number; count: number } | null
}

export function firingDocument({ studio, kiln, firing, room, priceList, reviews }: FiringFacts): FiringDocument {
  const spec = kiln.spec
  const shelf = shelfFootprint(spec)
  const example = priceList
    ? quoteRequest(
        priceList,
        { atmosphere: firing.atmosphere, slowCool: firing.slowCool, kind: firing.kind as FiringKind },
        [EXAMPLE_MUG],
        spec,
      )
    : null
  return {
    id: firing.id,
    studioId: studio.id,
    studioName: studio.name,
    studioCity: studio.city,
    studioRegion: studio.region,
    verified: studio.verified,
    kilnId: kiln.id,
    kilnName: kiln.name,
    kilnKind: kiln.kind,
    kilnMinCone: spec.minCone,
    kilnMaxCone: spec.maxCone,
    kilnAtmospheres: spec.atmospheres,
    cone: firing.cone,
    coneRank: coneIndex(firing.cone),
    atmosphere: firing.atmosphere,
    kind: firing.kind,
    slowCool: firing.slowCool,
    dropOffBy: firing.dropOffBy.toISOString(),
    dropOffByTs: seconds(firing.dropOffBy),
    firingDate: firing.firingDate.toISOString(),
    firingDateTs: seconds(firing.firingDate),
    readyBy: firing.readyBy.toISOString(),
    spaceLeftShelves: room.shelvesLeft,
    shelvesTotal: room.shelvesTotal,
    roomTallestMm: room.tallestMm,
    usableHeightMm: usableHeightMm(spec),
    shelfShape: shelf.shape,
    shelfDiameterMm: shelf.shape === 'round' ? shelf.diameterMm : null,
    shelfWidthMm: shelf.shape === 'box' ? shelf.widthMm : null,
    shelfDepthMm: shelf.shape === 'box' ? shelf.depthMm : null,
    priceExampleCents: example?.totalCents ?? null,
    priceExampleLabel: example ? EXAMPLE_MUG.label! : null,
    currency: priceList?.currency ?? studio.currency,
    ratingScore: reviews?.score ?? null,
    reviewFireAgain: reviews?.fireAgain ?? 0,
    reviewCount: reviews?.count ?? 0,
    notes: firing.notes,
    priceList,
    quoteKiln: { interior: spec.interior, controlledCooling: spec.controlledCooling, preheatHold: spec.preheatHold },
    _geo: { lat: studio.lat, lng: studio.lng },
  }
}
