import { describe, expect, it } from 'vitest'
import { townsToName, townsWithin } from '../../server/services/gazetteer'
import type { TownLabel } from '../../shared/schemas/places'
import { labelBox, placeTownLabels } from '../../src/components/map/town-labels'

const town = (name: string, postalCount: number, x: number, y: number): TownLabel => ({ name, region: 'OR', lat: y, lng: x, postalCount })
const flat = (t: TownLabel) => ({ x: t.lng, y: t.lat })

describe('town names on the offline map', () => {
  it('keeps the bigger town where two names would overlap, and both where they do not', () => {
    const placed = placeTownLabels([town('Gresham', 8, 200, 100), town('Portland', 40, 210, 104), town('Salem', 20, 200, 300)], flat, {
      width: 600,
      height: 400,
    })
    expect(placed.map((p) => p.town.name)).toEqual(['Portland', 'Salem'])
  })

  it('never draws two names over each other, nor one cut by the map’s edge', () => {
    const many = Array.from({ length: 300 }, (_, i) => town(`Town ${i}`, 300 - i, (i * 37) % 640, (i * 53) % 420))
    const placed = placeTownLabels(many, flat, { width: 640, height: 420 }, 300)
    const boxes = placed.map((p) => labelBox(p.town.name, p.x, p.y))
    for (const [i, a] of boxes.entries()) {
      expect(a.left >= 0 && a.top >= 0 && a.right <= 640 && a.bottom <= 420).toBe(true)
      for (const b of boxes.slice(i + 1)) expect(a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom).toBe(false)
    }
    expect(placed.length).toBeGreaterThan(10)
  })

  it('names Portland first around Portland, Oregon', () => {
    // Portland is Oregon's most populous city (U.S. Census Bureau, 2020 census; from memory), and
    // has the most ZIP codes of the towns around it.
    const around = { west: -123.2, south: 45.2, east: -122.2, north: 45.8 }
    expect(townsWithin(around, 1, 5)[0].name).toBe('Portland')
    // Zoomed out to the region only towns of several postal codes are offered; at city zoom, more.
    expect(townsToName(around, 6).length).toBeLessThan(townsToName(around, 12).length)
  })
})
