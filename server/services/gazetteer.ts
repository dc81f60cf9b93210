import tzLookup from '@photostructure/tz-lookup'
import { createRequire } from 'node:module'
import type { Place, TownLabel } from '../../shared/schemas/places'

export type { Place } from '../../shared/schemas/places'

// The offline gazetteer: United States ZIP codes and Canadian forward sortation areas (the first half
// of a postal code) from the `zipcodes` package, with towns as the centroid of their postal codes.

interface PostalRecord {
  zip: string
  latitude: number | null
  longitude: number | null
  city: string
  state: string
  country: string
}

interface PostalDistrict {
  code: string
  lat: number
  lng: number
  city: string
  region: string
  country: Place['country']
}

interface Town {
  name: string
  region: string
  country: Place['country']
  lat: number
  lng: number
  postalCount: number
}

interface Region {
  code: string
  country: Place['country']
  name: string
}

interface Index {
  postal: Map<string, PostalDistrict>
  /** Every ZIP code and FSA, sorted, for prefix search. */
  postalCodes: string[]
  /** Towns by name key, the one with most postal codes first. */
  towns: Map<string, Town[]>
  townKeys: string[]
  /** Regions by code and by full name, both as word keys ("OR", "OREGON"). */
  regions: Map<string, Region>
}

const CANADIAN_REGIONS: Record<string, string> = {
  AB: 'Alberta',
  BC: 'British Columbia',
  MB: 'Manitoba',
  NB: 'New Brunswick',
  NL: 'Newfoundland and Labrador',
  NS: 'Nova Scotia',
  NT: 'Northwest Territories',
  NU: 'Nunavut',
  ON: 'Ontario',
  PE: 'Prince Edward Island',
  QC: 'Quebec',
  SK: 'Saskatchewan',
  YT: 'Yukon',
}

// Names the package's state table lacks or spells differently; only codes present in the data are used.
const EXTRA_REGION_NAMES: Record<string, string> = {
  'PUERTO RICO': 'PR',
  GUAM: 'GU',
  'VIRGIN ISLANDS': 'VI',
  'US VIRGIN ISLANDS': 'VI',
  'AMERICAN SAMOA': 'AS',
  'NORTHERN MARIANA ISLANDS': 'MP',
  PALAU: 'PW',
  'MARSHALL ISLANDS': 'MH',
  MICRONESIA: 'FM',
  NEWFOUNDLAND: 'NL',
  'YUKON TERRITORY': 'YT',
  'NUNAVUT TERRITORY': 'NU',
  'NORTHWEST TERRITORY': 'NT',
}

/** Regions whose places lie east of Greenwich (Wake Island is filed under HI). */
const EASTERN_HEMISPHERE_REGIONS = new Set(['GU', 'MP', 'PW', 'FM', 'MH', 'HI'])

/** Military mail (Armed Forces Americas, Europe, Pacific): no place on a map. */
const MILITARY_REGIONS = new Set(['AA', 'AE', 'AP'])

/**
 * The province an FSA belongs to, by its first letter (Canada Post's allocation, from memory; X is
 * shared by Nunavut, X0A–X0C, and the Northwest Territories).
 */
function provinceOfFsa(fsa: string): string | null {
  const letter = fsa[0]
  if (letter === 'X') return /^X0[ABC]/.test(fsa) ? 'NU' : 'NT'
  const byLetter: Record<string, string> = {
    A: 'NL',
    B: 'NS',
    C: 'PE',
    E: 'NB',
    G: 'QC',
    H: 'QC',
    J: 'QC',
    K: 'ON',
    L: 'ON',
    M: 'ON',
    N: 'ON',
    P: 'ON',
    R: 'MB',
    S: 'SK',
    T: 'AB',
    V: 'BC',
    Y: 'YT',
  }
  return byLetter[letter] ?? null
}

// Letters Canada Post uses: no D, F, I, O, Q or U anywhere, and no W or Z in first place.
const CA_FIRST = '[ABCEGHJ-NPRSTVXY]'
const CA_LETTER = '[ABCEGHJ-NPRSTV-Z]'
const CA_POSTAL_WHOLE = new RegExp(`^(${CA_FIRST}\\d${CA_LETTER})(?:[ -]?(\\d${CA_LETTER}\\d))?$`, 'i')
const CA_POSTAL_IN_TEXT = new RegExp(`(?<![A-Za-z0-9])(${CA_FIRST}\\d${CA_LETTER})[ -]?(\\d${CA_LETTER}\\d)(?![A-Za-z0-9])`, 'gi')
const CA_FSA_AT_END = new RegExp(`(?<![A-Za-z0-9])(${CA_FIRST}\\d${CA_LETTER})$`, 'i')
const US_ZIP_WHOLE = /^(\d{5})(?:-(\d{4}))?$/
const US_ZIP_IN_TEXT = /(?<![A-Za-z0-9-])(\d{5})(?:-(\d{4}))?(?![A-Za-z0-9])/g

const COUNTRY_NAMES = new Set(['US', 'USA', 'U S', 'U S A', 'UNITED STATES', 'UNITED STATES OF AMERICA', 'CANADA'])

// Spelled-out and abbreviated forms are the same town: "St. Louis" and "Saint Louis".
const WORD_ALIASES: Record<string, string> = { ST: 'SAINT', STE: 'SAINTE', FT: 'FORT', MT: 'MOUNT', PT: 'POINT' }

/** Upper-case words without accents or punctuation: the unit every comparison is made in. */
function wordsOf(text: string): string[] {
  return text
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .toUpperCase()
    .replace(/['’.]/g, '')
    .split(/[^A-Z0-9]+/)
    .filter(Boolean)
}

function townKey(words: string[], expandLastWord = true): string {
  return words.map((word, i) => (i < words.length - 1 || expandLastWord ? (WORD_ALIASES[word] ?? word) : word)).join(' ')
}

const LOWER_PARTICLES = new Set(['aux', 'de', 'des', 'du', 'la', 'le', 'les', 'sur', 'en'])

/** The data writes "Melcher-dallas" and "Mcminnville"; show "Melcher-Dallas" and "McMinnville". */
function displayName(raw: string): string {
  return raw
    .trim()
    .replace(/\s+/g, ' ')
    .replace(
      /(?<=\p{L})-(\p{Ll}+)/gu,
      (_m, part: string) => '-' + (LOWER_PARTICLES.has(part) ? part : part[0].toUpperCase() + part.slice(1)),
    )
    .replace(/\bMc(\p{Ll})/gu, (_m, letter: string) => 'Mc' + letter.toUpperCase())
}

const DISTRICT_QUALIFIERS = new Set([
  'North',
  'South',
  'East',
  'West',
  'Central',
  'Northeast',
  'Northwest',
  'Southeast',
  'Southwest',
  'Inner',
  'Outer',
  'Upper',
  'Lower',
  'Outskirts',
  'Northern',
  'Southern',
  'Eastern',
  'Western',
  'And',
  '&',
])

/**
 * The Canadian data names districts, not towns ("Kelowna Central", "Vancouver (Kitsilano)",
 * "Downtown Toronto (Rosedale)"); the town is what is left without the neighbourhood and the compass.
 */
function canadianTown(raw: string): string {
  const name = raw
    .split('(')[0]
    .trim()
    .replace(/^Downtown /, '')
  const words = name.split(/\s+/)
  let end = words.length
  while (end > 1 && DISTRICT_QUALIFIERS.has(words[end - 1])) end--
  return displayName(words.slice(0, end).join(' '))
}

let index: Index | null = null

/** Reads the package's data and builds the indexes, once, on first use (the data is about 5 MB). */
function gazetteer(): Index {
  if (index) return index
  const require = createRequire(import.meta.url)
  const us = (require('zipcodes/lib/codes.js') as { codes: Record<string, PostalRecord> }).codes
  const canada = (require('zipcodes/lib/codesCanada.js') as { codes: Record<string, PostalRecord> }).codes
  const stateNames = (require('zipcodes/lib/states.js') as { full: Record<string, string> }).full

  const postal = new Map<string, PostalDistrict>()
  const townPositions = new Map<string, { key: string; town: Town; positions: Map<string, [number, number]> }>()

  const add = (district: PostalDistrict) => {
    postal.set(district.code, district)
    const key = townKey(wordsOf(district.city))
    const id = `${key}|${district.region}`
    let entry = townPositions.get(id)
    if (!entry) {
      entry = {
        key,
        town: { name: district.city, region: district.region, country: district.country, lat: 0, lng: 0, postalCount: 0 },
        positions: new Map(),
      }
      townPositions.set(id, entry)
    }
    entry.positions.set(`${district.lat},${district.lng}`, [district.lat, district.lng])
    entry.town.postalCount++
  }

  const hasPosition = (r: PostalRecord) =>
    Number.isFinite(r.latitude) && Number.isFinite(r.longitude) && !(r.latitude === 0 && r.longitude === 0)

  for (const record of Object.values(us)) {
    if (MILITARY_REGIONS.has(record.state) || !hasPosition(record)) continue
    // A few rows have the longitude's sign lost (10200 lands in Asia); the states lie west of Greenwich.
    if (record.longitude! > 0 && !EASTERN_HEMISPHERE_REGIONS.has(record.state)) continue
    add({
      code: record.zip,
      lat: record.latitude!,
      lng: record.longitude!,
      city: displayName(record.city),
      region: record.state,
      country: 'US',
    })
  }
  for (const record of Object.values(canada)) {
    // Some Canadian rows are shifted by a column (no latitude); the FSA's letter gives the province.
    const region = provinceOfFsa(record.zip)
    if (!region || !hasPosition(record)) continue
    add({ code: record.zip, lat: record.latitude!, lng: record.longitude!, city: canadianTown(record.city), region, country: 'CA' })
  }

  const towns = new Map<string, Town[]>()
  for (const { key, town, positions } of townPositions.values()) {
    const [lat, lng] = townCentre([...positions.values()])
    town.lat = lat
    town.lng = lng
    const list = towns.get(key) ?? []
    list.push(town)
    towns.set(key, list)
  }
  for (const list of towns.values()) list.sort(byPostalCount)

  const regions = new Map<string, Region>()
  const codes = new Set([...postal.values()].map((d) => d.region))
  const addRegion = (name: string, code: string) => {
    if (!codes.has(code)) return
    const country: Place['country'] = code in CANADIAN_REGIONS ? 'CA' : 'US'
    const region = regions.get(code) ?? { code, country, name }
    regions.set(code, region)
    regions.set(wordsOf(name).join(' '), region)
  }
  for (const [code, name] of Object.entries(CANADIAN_REGIONS)) addRegion(name, code)
  for (const [name, code] of Object.entries(stateNames)) addRegion(name, code)
  for (const [name, code] of Object.entries(EXTRA_REGION_NAMES)) addRegion(name, code)
  for (const code of codes) addRegion(code, code)

  index = {
    postal,
    postalCodes: [...postal.keys()].sort(),
    towns,
    townKeys: [...towns.keys()].sort(),
    regions,
  }
  return index
}

/**
 * The centroid of a town's ZIP positions, counting each position once (its post-office-box ZIPs
 * often share one placeholder point) and leaving out any more than 50 km from the median.
 */
function townCentre(positions: [number, number][]): [number, number] {
  const median = (values: number[]) => {
    const sorted = [...values].sort((a, b) => a - b)
    const mid = sorted.length >> 1
    return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2
  }
  const lat0 = median(positions.map((p) => p[0]))
  const lng0 = median(positions.map((p) => p[1]))
  const kmPerDegree = 111.2
  const near = positions.filter(([lat, lng]) => Math.hypot(lat - lat0, (lng - lng0) * Math.cos((lat0 * Math.PI) / 180)) * kmPerDegree <= 50)
  const kept = near.length ? near : positions
  const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length
  return [round(mean(kept.map((p) => p[0]))), round(mean(kept.map((p) => p[1])))]
}

function byPostalCount(a: Town, b: Town): number {
  return b.postalCount - a.postalCount || a.region.localeCompare(b.region)
}

function round(degrees: number): number {
  return Math.round(degrees * 1e5) / 1e5
}

/** Builds the indexes now rather than on the first request. */
export function warmGazetteer(): void {
  gazetteer()
}

/** The IANA time zone at a point, from the tz-lookup package's boundary data. */
export function timezoneAt(lat: number, lng: number): string {
  return tzLookup(lat, lng)
}

function districtPlace(district: PostalDistrict, postalCode: string): Place {
  return {
    label: `${district.city}, ${district.region} ${postalCode}`,
    lat: district.lat,
    lng: district.lng,
    postalCode,
    city: district.city,
    region: district.region,
    country: district.country,
    timezone: timezoneAt(district.lat, district.lng),
  }
}

function townPlace(town: Town): Place {
  return {
    label: `${town.name}, ${town.region}`,
    lat: town.lat,
    lng: town.lng,
    postalCode: null,
    city: town.name,
    region: town.region,
    country: town.country,
    timezone: timezoneAt(town.lat, town.lng),
  }
}

function tidy(query: string): string {
  return query.normalize('NFKC').trim().replace(/\s+/g, ' ')
}

function canadianCode(fsa: string, rest: string | undefined): string {
  return rest ? `${fsa.toUpperCase()} ${rest.toUpperCase()}` : fsa.toUpperCase()
}

/** A ZIP code or postal code the query is, or one an address carries (the last one found wins). */
function postalMatch(idx: Index, text: string): Place | null | undefined {
  const zip = US_ZIP_WHOLE.exec(text)
  if (zip) {
    const district = idx.postal.get(zip[1])
    return district ? districtPlace(district, zip[2] ? `${zip[1]}-${zip[2]}` : zip[1]) : null
  }
  const canadian = CA_POSTAL_WHOLE.exec(text)
  if (canadian) {
    const district = idx.postal.get(canadian[1].toUpperCase())
    return district ? districtPlace(district, canadianCode(canadian[1], canadian[2])) : null
  }

  const found: { at: number; code: string; postalCode: string }[] = []
  for (const m of text.matchAll(US_ZIP_IN_TEXT)) {
    // A five-digit number opening an address is its house number.
    if (m.index === 0) continue
    found.push({ at: m.index, code: m[1], postalCode: m[2] ? `${m[1]}-${m[2]}` : m[1] })
  }
  for (const m of text.matchAll(CA_POSTAL_IN_TEXT)) {
    found.push({ at: m.index, code: m[1].toUpperCase(), postalCode: canadianCode(m[1], m[2]) })
  }
  const fsa = CA_FSA_AT_END.exec(text)
  if (fsa) found.push({ at: fsa.index, code: fsa[1].toUpperCase(), postalCode: fsa[1].toUpperCase() })

  for (const { code, postalCode } of found.sort((a, b) => b.at - a.at)) {
    const district = idx.postal.get(code)
    if (district) return districtPlace(district, postalCode)
  }
  return undefined
}

function regionOf(idx: Index, words: string[]): Region | null {
  return words.length ? (idx.regions.get(words.join(' ')) ?? null) : null
}

function findTown(idx: Index, words: string[], region: Region | null): Town | null {
  if (!words.length) return null
  const list = idx.towns.get(townKey(words))
  if (!list) return null
  return region ? (list.find((t) => t.region === region.code) ?? null) : list[0]
}

/** "Portland OR", "Salt Lake City Utah", "Charlottetown Prince Edward Island", or a bare "Portland". */
function townInWords(idx: Index, words: string[]): Town | null {
  for (const n of [3, 2, 1]) {
    if (words.length <= n) continue
    const region = regionOf(idx, words.slice(-n))
    const town = region && findTown(idx, words.slice(0, -n), region)
    if (town) return town
  }
  return findTown(idx, words, null)
}

function townMatch(idx: Index, text: string): Town | null {
  // Postal codes that did not resolve are noise for the town part of an address.
  const withoutCodes = text.replace(US_ZIP_IN_TEXT, ' ').replace(CA_POSTAL_IN_TEXT, ' ').replace(CA_FSA_AT_END, ' ')
  const segments = withoutCodes
    .split(',')
    .map((s) => wordsOf(s))
    .filter((w) => w.length)
  while (segments.length > 1 && COUNTRY_NAMES.has(segments[segments.length - 1].join(' '))) segments.pop()
  if (!segments.length) return null
  if (segments.length >= 2) {
    const region = regionOf(idx, segments[segments.length - 1])
    const town = region && findTown(idx, segments[segments.length - 2], region)
    if (town) return town
  }
  return townInWords(idx, segments[segments.length - 1])
}

/**
 * One place for what someone typed: a ZIP or ZIP+4, a Canadian postal code or FSA, "City, ST",
 * "City State", a bare city (the one with most postal codes when several states share the name), or
 * a street address, through its postal code when it has a known one and its town otherwise.
 */
export function lookupPlace(query: string): Place | null {
  const text = tidy(query)
  if (!text || text.length > 200) return null
  const idx = gazetteer()
  const postal = postalMatch(idx, text)
  if (postal !== undefined) return postal
  const town = townMatch(idx, text)
  return town ? townPlace(town) : null
}

/** The sorted keys that start with a prefix, by binary search for the first one. */
function withPrefix(sorted: string[], prefix: string): string[] {
  let low = 0
  let high = sorted.length
  while (low < high) {
    const mid = (low + high) >> 1
    if (sorted[mid] < prefix) low = mid + 1
    else high = mid
  }
  const out: string[] = []
  for (let i = low; i < sorted.length && sorted[i].startsWith(prefix); i++) out.push(sorted[i])
  return out
}

function townsWithPrefix(idx: Index, words: string[], region: (r: string) => boolean): { key: string; town: Town }[] {
  if (!words.length) return []
  // The last word may still be being typed, so "St" also looks for "St…" and not only "Saint…".
  const keys = new Set([townKey(words, false), townKey(words, true)])
  const out: { key: string; town: Town }[] = []
  for (const prefix of keys) {
    for (const key of withPrefix(idx.townKeys, prefix)) {
      for (const town of idx.towns.get(key)!) if (region(town.region)) out.push({ key, town })
    }
  }
  return out
}

let townsBySize: Town[] | null = null

/**
 * Towns whose centre lies in the bounds, biggest first (by how many postal codes they have, the
 * gazetteer's measure of size), leaving out those with fewer than `minPostalCodes`.
 */
export function townsWithin(
  bounds: { west: number; south: number; east: number; north: number },
  minPostalCodes: number,
  limit: number,
): TownLabel[] {
  townsBySize ??= [...gazetteer().towns.values()].flat().sort(byPostalCount)
  const out: TownLabel[] = []
  for (const town of townsBySize) {
    if (town.postalCount < minPostalCodes || out.length >= limit) break
    if (town.lat < bounds.south || town.lat > bounds.north || town.lng < bounds.west || town.lng > bounds.east) continue
    out.push({ name: town.name, region: town.region, lat: town.lat, lng: town.lng, postalCount: town.postalCount })
  }
  return out
}

/** Enough to fill a large screen once the map drops the names that would overlap. */
const TOWNS_PER_VIEW = 120

/** The towns a map at this zoom may name: zoomed out only towns of several postal codes, at city zoom every town. */
export function townsToName(bounds: { west: number; south: number; east: number; north: number }, zoom: number): TownLabel[] {
  const minPostalCodes = zoom < 7 ? 20 : zoom < 9 ? 4 : zoom < 11 ? 2 : 1
  return townsWithin(bounds, minPostalCodes, TOWNS_PER_VIEW)
}

/** Places for an autocomplete: ZIP, FSA or town-name prefixes, largest towns first, no repeats. */
export function searchPlaces(query: string, limit = 8): Place[] {
  const text = tidy(query)
  if (!text || text.length > 200 || limit < 1) return []
  const idx = gazetteer()

  const zip = /^(\d{1,5})(?:-(\d{0,4}))?$/.exec(text)
  if (zip) {
    const codes = zip[1].length === 5 ? (idx.postal.has(zip[1]) ? [zip[1]] : []) : withPrefix(idx.postalCodes, zip[1])
    const full = zip[2]?.length === 4 ? `${zip[1]}-${zip[2]}` : null
    return codes.slice(0, limit).map((code) => districtPlace(idx.postal.get(code)!, full ?? code))
  }
  // "V", then "V5", "V5K", "V5K 0", … "V5K 0A1": only the FSA part can be matched, the rest is shown.
  const canadian = /^([A-Z]\d[A-Z]?)(?:[ -]?(\d(?:[A-Z]\d?)?))?$/i.exec(text)
  if (canadian && (!canadian[2] || canadian[1].length === 3)) {
    const fsa = canadian[1].toUpperCase()
    const full = canadian[2]?.length === 3 ? canadianCode(fsa, canadian[2]) : null
    return withPrefix(idx.postalCodes, fsa)
      .slice(0, limit)
      .map((code) => districtPlace(idx.postal.get(code)!, full ?? code))
  }

  const comma = text.lastIndexOf(',')
  const nameWords = wordsOf(comma >= 0 ? text.slice(0, comma) : text)
  let matches: { key: string; town: Town }[]
  if (comma >= 0) {
    const typed = wordsOf(text.slice(comma + 1)).join(' ')
    const fitsRegion = (code: string) => {
      if (!typed) return true
      const region = idx.regions.get(code)
      return code.startsWith(typed) || Boolean(region && wordsOf(region.name).join(' ').startsWith(typed))
    }
    matches = townsWithPrefix(idx, nameWords, fitsRegion)
  } else {
    matches = townsWithPrefix(idx, nameWords, () => true)
    for (const n of [3, 2, 1]) {
      if (matches.length || nameWords.length <= n) continue
      const region = regionOf(idx, nameWords.slice(-n))
      if (region) matches = townsWithPrefix(idx, nameWords.slice(0, -n), (code) => code === region.code)
    }
  }

  const exact = new Set([townKey(nameWords)])
  matches.sort(
    (a, b) =>
      Number(exact.has(b.key)) - Number(exact.has(a.key)) || byPostalCount(a.town, b.town) || a.town.name.localeCompare(b.town.name),
  )
  const places = new Map<string, Place>()
  for (const { town } of matches) {
    const place = townPlace(town)
    if (!places.has(place.label)) places.set(place.label, place)
    if (places.size >= limit) break
  }
  return [...places.values()]
}
