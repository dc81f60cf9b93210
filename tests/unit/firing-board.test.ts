import { describe, expect, it } from 'vitest'
import { quoteRequest } from '../../shared/firing/quote'
import type { SearchHit } from '../../shared/schemas/search'
import { FIRINGS_PER_STUDIO, groupByStudio, pieceOfSearch, type BoardHit } from '../../shared/search/board'

const studio = (id: string, name: string): SearchHit['studio'] => ({
  id,
  name,
  lat: 45.5,
  lng: -122.6,
  city: 'Portland',
  region: 'OR',
  verified: true,
})
const kiln = (id: string): SearchHit['kiln'] => ({
  id,
  name: `Kiln ${id}`,
  kind: 'electric',
  minCone: '022',
  maxCone: '6',
  atmospheres: ['oxidation'],
  usableHeightMm: 600,
  shelf: { shape: 'round', diameterMm: 560, widthMm: null, depthMm: null },
})

let serial = 0
function hit(owner: SearchHit['studio'], kilnId: string, cone: string, day: number): BoardHit {
  serial += 1
  const at = (d: number) => new Date(Date.UTC(2027, 2, d)).toISOString()
  return {
    firingId: `firing-${serial}`,
    studio: owner,
    kiln: kiln(kilnId),
    cone,
    atmosphere: 'oxidation',
    kind: 'glaze',
    dropOffBy: at(day),
    firingDate: at(day + 2),
    readyBy: at(day + 4),
    space: { shelvesLeft: 2, shelvesTotal: 5, tallestMm: 300 },
    distanceKm: 3.2,
    priceExample: { label: 'Mug', totalCents: 900, currency: 'USD' },
    reviews: null,
    piecePrice: null,
  }
}

describe('the firing board groups firings by studio', () => {
  it('shows a studio with four firings as one card with four chips, in the order the search ranked them', () => {
    const alder = studio('alder', 'Alder Street Clay')
    const fern = studio('fern', 'Fernhill Kilns')
    const hits = [
      hit(alder, 'a1', '6', 3),
      hit(fern, 'f1', '10', 4),
      hit(alder, 'a2', '04', 5),
      hit(alder, 'a1', '6', 10),
      hit(alder, 'a1', '6', 17),
    ]
    const cards = groupByStudio(['alder', 'fern'], hits)
    expect(cards.map((card) => card.studio.name)).toEqual(['Alder Street Clay', 'Fernhill Kilns'])
    expect(cards[0].firings.map((f) => f.firingId)).toEqual([hits[0], hits[2], hits[3], hits[4]].map((h) => h.firingId))
    expect(cards[0].firings.map((f) => f.cone)).toEqual(['6', '04', '6', '6'])
    // Two kilns, each named once on the card's kiln line.
    expect(cards[0].kilns.map((k) => k.id)).toEqual(['a1', 'a2'])
    expect(cards[0].moreFirings).toBe(0)
    expect(cards[1].firings).toHaveLength(1)
  })

  it('follows the page of studios, not the order firings came in, and drops studios with no firing', () => {
    const alder = studio('alder', 'Alder Street Clay')
    const fern = studio('fern', 'Fernhill Kilns')
    const cards = groupByStudio(['fern', 'gone', 'alder'], [hit(alder, 'a1', '6', 3), hit(fern, 'f1', '10', 4)])
    expect(cards.map((card) => card.studio.id)).toEqual(['fern', 'alder'])
  })

  it('caps the chips on a card and counts the rest as more at the studio', () => {
    const busy = studio('busy', 'Busy Kilns')
    const hits = Array.from({ length: FIRINGS_PER_STUDIO + 4 }, (_, i) => hit(busy, 'b1', '6', i + 1))
    const [card] = groupByStudio(['busy'], hits, new Map([['busy', FIRINGS_PER_STUDIO + 9]]))
    expect(card.firings).toHaveLength(FIRINGS_PER_STUDIO)
    expect(card.moreFirings).toBe(9)
  })
})

describe('the potter’s own piece on the board', () => {
  it('is the size the search filters on, priced by the shared quote', () => {
    // 4 in = 101.6 mm exactly (1 in = 25.4 mm, NIST SP 811); a 4 × 4 × 4 in box is 64 cubic inches,
    // which at 5 cents a cubic inch is 320 cents (arithmetic from the definition of the inch).
    const piece = pieceOfSearch({ heightMm: 101.6, widthMm: 101.6, depthMm: 101.6 })!
    const quote = quoteRequest(
      { currency: 'USD', model: 'volume', centsPerCubicInch: 5, deposit: { percent: 25 } },
      { atmosphere: 'oxidation', slowCool: false },
      [piece],
    )
    expect(quote.totalCents).toBe(320)
    expect(pieceOfSearch({ heightMm: 101.6, widthMm: 101.6, depthMm: null })?.round).toBe(true)
  })

  it('is not made up from a height alone', () => {
    expect(pieceOfSearch({ heightMm: 300, widthMm: null, depthMm: null })).toBeNull()
  })
})
