import { getDistance } from 'geolib'
import { createRequire } from 'node:module'
import { describe, expect, it } from 'vitest'
import { lookupPlace, searchPlaces, timezoneAt } from '../../server/services/gazetteer'

// Reference points are landmarks whose street address carries the ZIP or postal code under test,
// and city coordinates as commonly published (the city's own coordinates in gazetteers and
// encyclopedias). All of them are from memory; distances are measured with geolib, a general-purpose
// geodesy library from the registry, so the tolerances absorb a few hundred metres of recall error.

function metresBetween(place: { lat: number; lng: number } | null, lat: number, lng: number): number {
  expect(place).not.toBeNull()
  return getDistance({ lat, lng }, { lat: place!.lat, lng: place!.lng })
}

// A ZIP or FSA position is a point inside a district a few kilometres across.
const POSTAL_TOLERANCE_M = 3_000
// A town is the centroid of its ZIP codes; the USPS town spreads over its suburbs.
const TOWN_TOLERANCE_M = 10_000

describe('lookupPlace: ZIP codes', () => {
  it.each([
    // [code, landmark with that code in its address, lat, lng] — landmark positions from memory.
    ['97214', 'Laurelhurst Park, SE Cesar E Chavez Blvd & Stark St, Portland, OR 97214', 45.5212, -122.6254],
    ['10001', 'Madison Square Garden, 4 Pennsylvania Plaza, New York, NY 10001', 40.7505, -73.9934],
    ['60606', 'Willis Tower, 233 S Wacker Dr, Chicago, IL 60606', 41.8789, -87.6359],
    ['83702', 'Idaho State Capitol, 700 W Jefferson St, Boise, ID 83702', 43.6178, -116.1996],
    ['80202', 'Union Station, 1701 Wynkoop St, Denver, CO 80202', 39.7527, -105.0002],
    ['98101', 'Pike Place Market, 85 Pike St, Seattle, WA 98101', 47.6094, -122.3418],
  ])('%s lies within a few km of %s', (zip, _landmark, lat, lng) => {
    const place = lookupPlace(zip)
    expect(place?.postalCode).toBe(zip)
    expect(place?.country).toBe('US')
    expect(metresBetween(place, lat, lng)).toBeLessThan(POSTAL_TOLERANCE_M)
  })

  it('labels a ZIP with its town and state', () => {
    expect(lookupPlace('97214')).toMatchObject({ label: 'Portland, OR 97214', city: 'Portland', region: 'OR' })
  })

  it('reads ZIP+4 as its five-digit ZIP and keeps the full code', () => {
    const plus4 = lookupPlace('97214-1234')
    const zip = lookupPlace('97214')
    expect(plus4?.postalCode).toBe('97214-1234')
    expect([plus4?.lat, plus4?.lng]).toEqual([zip?.lat, zip?.lng])
  })

  it('tolerates surrounding whitespace', () => {
    expect(lookupPlace('  10001 ')?.postalCode).toBe('10001')
  })
})

describe('lookupPlace: Canadian postal codes', () => {
  it.each([
    // Canada Post codes in landmark addresses; positions from memory.
    ['V5K 5J1', 'V5K', 'Pacific National Exhibition, 2901 E Hastings St, Vancouver, BC V5K 5J1', 49.282, -123.0425],
    ['M5V 3L9', 'M5V', 'CN Tower, 290 Bremner Blvd, Toronto, ON M5V 3L9', 43.6426, -79.3871],
    ['H2X 1Z8', 'H2X', 'Place des Arts, 175 Rue Sainte-Catherine O, Montréal, QC H2X 1Z8', 45.5081, -73.5667],
  ])('%s (FSA %s) lies within a few km of %s', (code, fsa, _landmark, lat, lng) => {
    const place = lookupPlace(code)
    expect(place?.country).toBe('CA')
    expect(place?.postalCode).toBe(code)
    expect(metresBetween(place, lat, lng)).toBeLessThan(POSTAL_TOLERANCE_M)
    expect(lookupPlace(fsa)?.lat).toBe(place?.lat)
  })

  it('accepts lower case, no space and the FSA alone', () => {
    expect(lookupPlace('v5k0a1')).toMatchObject({ postalCode: 'V5K 0A1', region: 'BC', city: 'Vancouver' })
    expect(lookupPlace('v5k')).toMatchObject({ postalCode: 'V5K', region: 'BC' })
  })

  it('names the province from the FSA (Canada Post: M is Toronto, H is Montréal, T is Alberta; common knowledge)', () => {
    expect(lookupPlace('M5V')?.region).toBe('ON')
    expect(lookupPlace('H2X')?.region).toBe('QC')
    expect(lookupPlace('T2P')?.region).toBe('AB')
  })
})

describe('lookupPlace: towns', () => {
  it.each([
    // [query, expected label, published city coordinates from memory]
    ['Portland, OR', 'Portland, OR', 45.5152, -122.6784],
    ['portland or', 'Portland, OR', 45.5152, -122.6784],
    ['Portland, Maine', 'Portland, ME', 43.6591, -70.2568],
    ['Portland ME', 'Portland, ME', 43.6591, -70.2568],
    ['Boise, ID', 'Boise, ID', 43.615, -116.2023],
    ['Chicago', 'Chicago, IL', 41.8781, -87.6298],
    ['Denver CO', 'Denver, CO', 39.7392, -104.9903],
    ['New York, NY', 'New York, NY', 40.7128, -74.006],
    ['Salt Lake City Utah', 'Salt Lake City, UT', 40.7608, -111.891],
    ['St. Louis, MO', 'Saint Louis, MO', 38.627, -90.1994],
    ['Vancouver, BC', 'Vancouver, BC', 49.2827, -123.1207],
    ['Toronto, Ontario', 'Toronto, ON', 43.6532, -79.3832],
    ['Calgary', 'Calgary, AB', 51.0447, -114.0719],
  ])('%s → %s near the published city position', (query, label, lat, lng) => {
    const place = lookupPlace(query)
    expect(place?.label).toBe(label)
    expect(place?.postalCode).toBeNull()
    expect(metresBetween(place, lat, lng)).toBeLessThan(TOWN_TOLERANCE_M)
  })

  it('a bare name shared by several states picks the one with most ZIP codes, as the zipcodes package counts them', () => {
    const zipcodes = createRequire(import.meta.url)('zipcodes') as {
      lookupByName(city: string, state: string): unknown[]
      states: { abbr: Record<string, string> }
    }
    for (const name of ['Portland', 'Springfield', 'Salem']) {
      const counts = Object.keys(zipcodes.states.abbr).map((state) => ({ state, n: zipcodes.lookupByName(name, state).length }))
      const most = counts.sort((a, b) => b.n - a.n)[0]
      expect(lookupPlace(name)?.region, name).toBe(most.state)
    }
    // Common knowledge: Oregon's Portland is the larger city by far.
    expect(lookupPlace('Portland')?.region).toBe('OR')
  })

  it('"Washington" alone is the capital; "Bozeman MT" is not read as "Bozeman Mount"', () => {
    expect(lookupPlace('Washington')?.label).toBe('Washington, DC')
    expect(lookupPlace('Bozeman MT')?.label).toBe('Bozeman, MT')
  })
})

describe('lookupPlace: street addresses', () => {
  it('uses the ZIP an address ends in', () => {
    expect(lookupPlace('1421 SE Belmont St, Portland, OR 97214')).toMatchObject({ postalCode: '97214', label: 'Portland, OR 97214' })
    expect(lookupPlace('1421 SE Belmont St, Portland, OR 97214-3209, USA')?.postalCode).toBe('97214-3209')
  })

  it('uses the postal code a Canadian address carries', () => {
    expect(lookupPlace('290 Bremner Blvd, Toronto, ON M5V 3L9')).toMatchObject({ postalCode: 'M5V 3L9', region: 'ON' })
  })

  it('falls back to the town when there is no ZIP, and does not read a house number as one', () => {
    // 12345 is a real ZIP (Schenectady, NY; common knowledge), but here it is the house number.
    expect(lookupPlace('12345 Main St, Boise, ID')?.label).toBe('Boise, ID')
    expect(lookupPlace('1421 SE Belmont St, Portland')?.label).toBe('Portland, OR')
    expect(lookupPlace('Seattle, Washington, USA')?.label).toBe('Seattle, WA')
  })

  it('falls back to the town when the ZIP is unknown', () => {
    expect(lookupPlace('Portland, OR 97999')?.label).toBe('Portland, OR')
  })
})

describe('lookupPlace: unknown places', () => {
  it.each(['', '   ', '00000', '99999-0000', 'Atlantis, ZZ', 'Nowhere Special', 'Z9Z 9Z9'])('%j → null', (query) => {
    expect(lookupPlace(query)).toBeNull()
  })
})

describe('timezones', () => {
  it.each([
    // IANA tz database zone names for these cities (zone1970.tab; from memory).
    [45.5152, -122.6784, 'America/Los_Angeles'], // Portland, OR
    [40.7128, -74.006, 'America/New_York'], // New York
    [41.8781, -87.6298, 'America/Chicago'], // Chicago
    [39.7392, -104.9903, 'America/Denver'], // Denver
    [43.615, -116.2023, 'America/Boise'], // Boise: its own zone, Mountain time, not America/Denver
    [33.4484, -112.074, 'America/Phoenix'], // Phoenix: Mountain time without daylight saving
    [39.7684, -86.1581, 'America/Indiana/Indianapolis'], // Indianapolis
    [49.2827, -123.1207, 'America/Vancouver'], // Vancouver
    [51.0447, -114.0719, 'America/Edmonton'], // Calgary
  ])('(%f, %f) is in %s', (lat, lng, zone) => {
    expect(timezoneAt(lat, lng)).toBe(zone)
  })

  it('every place carries the zone at its position', () => {
    expect(lookupPlace('97214')?.timezone).toBe('America/Los_Angeles')
    expect(lookupPlace('Boise, ID')?.timezone).toBe('America/Boise')
    expect(lookupPlace('M5V 3L9')?.timezone).toBe('America/Toronto')
  })
})

describe('searchPlaces', () => {
  it('completes a town prefix, largest first, every one starting with the prefix', () => {
    const places = searchPlaces('Portl')
    expect(places[0].label).toBe('Portland, OR')
    expect(places.length).toBeGreaterThan(1)
    for (const place of places) expect(place.city.toLowerCase().startsWith('portl')).toBe(true)
  })

  it('narrows by the state typed after a comma', () => {
    const places = searchPlaces('Portland, m')
    expect(places.map((p) => p.label)).toContain('Portland, ME')
    for (const place of places) expect(place.region.startsWith('M')).toBe(true)
  })

  it('completes ZIP prefixes in order', () => {
    const places = searchPlaces('9721')
    expect(places.map((p) => p.postalCode)).toContain('97214')
    const codes = places.map((p) => p.postalCode!)
    expect(codes).toEqual([...codes].sort())
    for (const code of codes) expect(code.startsWith('9721')).toBe(true)
  })

  it('completes Canadian FSAs', () => {
    const places = searchPlaces('v5')
    expect(places.length).toBeGreaterThan(0)
    for (const place of places) {
      expect(place.postalCode!.startsWith('V5')).toBe(true)
      expect(place.region).toBe('BC')
    }
  })

  it('finds "Saint …" towns from "St"', () => {
    expect(searchPlaces('st lou').map((p) => p.label)).toContain('Saint Louis, MO')
  })

  it('keeps to the limit and never repeats a place', () => {
    expect(searchPlaces('s', 3)).toHaveLength(3)
    const labels = searchPlaces('spring', 20).map((p) => p.label)
    expect(new Set(labels).size).toBe(labels.length)
  })

  it('answers nothing for nothing', () => {
    expect(searchPlaces('')).toEqual([])
    expect(searchPlaces('qqqq')).toEqual([])
  })
})
