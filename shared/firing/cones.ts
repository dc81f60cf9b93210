// Pyrometric cone numbers and their temperature equivalents for self-supporting cones.
// Cones measure heat work (time and temperature together), so a cone's bending temperature depends
// on how fast the last 100 °C of the firing were climbed.

/** A cone number written the trade's way: "022" … "01", "1" … "14" (canonical form from parseCone). */
export type Cone = string

/** The whole cones of the published chart, coolest first. "06" is cooler than "6"; "022" is the coolest. */
export const CHARTED_CONES: readonly Cone[] = [
  '022',
  '021',
  '020',
  '019',
  '018',
  '017',
  '016',
  '015',
  '014',
  '013',
  '012',
  '011',
  '010',
  '09',
  '08',
  '07',
  '06',
  '05',
  '04',
  '03',
  '02',
  '01',
  '1',
  '2',
  '3',
  '4',
  '5',
  '6',
  '7',
  '8',
  '9',
  '10',
  '11',
  '12',
  '13',
  '14',
]

/**
 * The half cones made besides the whole ones (05½ and 5½, from memory of the cone maker's range).
 * The chart prints no row for them; they bend between their neighbours and are placed midway.
 */
export const HALF_CONES: readonly Cone[] = ['05½', '5½']

/** Every cone we read and offer, half cones included, coolest first. */
export const CONES: readonly Cone[] = CHARTED_CONES.flatMap((cone) =>
  cone === '05' ? [cone, '05½'] : cone === '5' ? [cone, '5½'] : [cone],
)

/** Heating rates (°C/h over the last 100 °C) of the published table's three columns. */
export const CONE_TABLE_RATES_C_PER_HOUR = [15, 60, 150] as const

// Temperature equivalents (°C) of regular self-supporting cones at 15 / 60 / 150 °C/h, in CHARTED_CONES order,
// from the cone maker's published temperature-equivalent chart (Orton, self-supporting, regular),
// checked column by column in tests/unit/firing/cones.test.ts, where the provenance of each value is
// noted. The chart gives no 150 °C/h value for 022–020; those rows hold their 60 °C/h value for faster
// rates rather than extrapolate or borrow another cone type's column.
const CHARTED_C: readonly (readonly [number, number, number | null])[] = [
  [586, 590, null],
  [600, 617, null],
  [626, 638, null],
  [656, 678, 695],
  [686, 715, 734],
  [705, 738, 763],
  [742, 772, 796],
  [750, 791, 818],
  [757, 807, 838],
  [807, 837, 861],
  [843, 861, 882],
  [857, 875, 894],
  [891, 903, 915],
  [907, 920, 930],
  [922, 942, 956],
  [962, 976, 987],
  [981, 998, 1013],
  [1021, 1031, 1044],
  [1046, 1063, 1077],
  [1071, 1086, 1104],
  [1078, 1102, 1122],
  [1093, 1119, 1138],
  [1109, 1137, 1154],
  [1112, 1142, 1164],
  [1115, 1152, 1170],
  [1141, 1162, 1183],
  [1159, 1186, 1207],
  [1185, 1222, 1243],
  [1201, 1239, 1257],
  [1211, 1249, 1271],
  [1224, 1260, 1280],
  [1251, 1285, 1305],
  [1272, 1294, 1315],
  [1285, 1306, 1326],
  [1310, 1331, 1348],
  [1351, 1365, 1384],
]

type Row = readonly [number, number, number | null]

// Each half cone sits midway between its neighbours in every column: our placement, not a charted value.
const SELF_SUPPORTING_C: readonly Row[] = CONES.map((cone) => {
  const at = CHARTED_CONES.indexOf(cone)
  if (at >= 0) return CHARTED_C[at]
  const below = CHARTED_C[CHARTED_CONES.indexOf(cone.replace('½', ''))]
  const above = CHARTED_C[CHARTED_CONES.indexOf(cone.replace('½', '')) + 1]
  return [0, 1, 2].map((column) => {
    const low = below[column] ?? below[1]
    const high = above[column] ?? above[1]
    return Math.round((low + high) / 2)
  }) as unknown as Row
})

/** The chart's row for a whole cone: [15, 60, 150 °C/h]; null for a half cone. */
export function chartedTemperaturesC(cone: Cone): Row | null {
  const at = CHARTED_CONES.indexOf(cone)
  return at >= 0 ? CHARTED_C[at] : null
}

const INDEX_BY_CONE = new Map<string, number>(CONES.map((cone, index) => [cone, index]))

const LOG_15 = Math.log(15)
const LOG_60 = Math.log(60)
const LOG_150 = Math.log(150)

export type ParseConeResult = { ok: true; cone: Cone } | { ok: false; reason: string }

const CONE_PATTERN = /^\s*(?:cone\s*)?(?:\^\s*)?(\d{1,4})\s*$/i
const HALF_PATTERN = /^\s*(?:cone\s*)?(?:\^\s*)?(\d{1,4})\s*(?:½|\.5|\s1\/2|-1\/2|1\/2)\s*$/i

/**
 * Reads a cone as people write it: "6", "06", "^6", "cone 6", "Cone 04", and the half cones "5½",
 * "5.5", "5 1/2", "05½". The leading zero matters (cone 06 is a low-fire cone, cone 6 a mid-fire
 * one), so it is kept, never dropped.
 */
export function parseCone(input: string): ParseConeResult {
  if (typeof input !== 'string' || input.trim() === '') {
    return { ok: false, reason: 'Enter a cone number, like 6 or 04.' }
  }
  const half = HALF_PATTERN.exec(input)
  if (half) {
    const cone = `${half[1]}½`
    if (INDEX_BY_CONE.has(cone)) return { ok: true, cone }
    return { ok: false, reason: `Cone ${half[1]}½ is not made; the half cones are 05½ and 5½.` }
  }
  const match = CONE_PATTERN.exec(input)
  if (!match) {
    if (/[½.]/.test(input)) {
      return { ok: false, reason: 'The only half cones are 05½ and 5½; otherwise pick a whole cone, like 5 or 6.' }
    }
    return { ok: false, reason: `"${input.trim()}" is not a cone number. Write it like 6, 06, ^6 or cone 04.` }
  }
  const digits = match[1]
  if (INDEX_BY_CONE.has(digits)) return { ok: true, cone: digits }
  if (/^0+$/.test(digits)) return { ok: false, reason: 'There is no cone 0. Did you mean cone 01 or cone 1?' }
  const oneLeadingZero = '0' + digits.replace(/^0+/, '')
  if (digits.startsWith('00') && INDEX_BY_CONE.has(oneLeadingZero)) {
    return { ok: false, reason: `Cone numbers take one leading zero: write ${oneLeadingZero} rather than ${digits}.` }
  }
  if (digits.startsWith('0')) {
    return { ok: false, reason: `Cone ${digits} is cooler than cone 022, the coolest in the table (022 to 14).` }
  }
  return { ok: false, reason: `Cone ${digits} is hotter than cone 14, the hottest in the table (022 to 14).` }
}

/** True when the value is a cone in its canonical form (as parseCone returns it). */
export function isCone(value: unknown): value is Cone {
  return typeof value === 'string' && INDEX_BY_CONE.has(value)
}

/** Position of a cone in CONES (0 = cone 022). Accepts any form parseCone reads; throws on others. */
export function coneIndex(cone: Cone): number {
  const index = INDEX_BY_CONE.get(cone)
  if (index !== undefined) return index
  const parsed = parseCone(cone)
  if (!parsed.ok) throw new RangeError(parsed.reason)
  return INDEX_BY_CONE.get(parsed.cone) as number
}

/**
 * A cone's place counted in whole cones: 022 is 0, each whole cone one more, a half cone half way
 * (05½ is 17.5). Tolerances of "one cone" are measured on this scale.
 */
export function coneStep(cone: Cone): number {
  const canonical = CONES[coneIndex(cone)]
  const at = CHARTED_CONES.indexOf(canonical)
  return at >= 0 ? at : CHARTED_CONES.indexOf(canonical.replace('½', '')) + 0.5
}

/** <0 when a is cooler than b, 0 when the same cone, >0 when a is hotter. */
export function compareCones(a: Cone, b: Cone): number {
  return coneIndex(a) - coneIndex(b)
}

/** "cone 6", "cone 04": the way a cone reads inside a sentence. */
export function formatCone(cone: Cone): string {
  return `cone ${CONES[coneIndex(cone)]}`
}

function temperatureAtIndex(index: number, rate: number): number {
  const [slow, medium, fastOrNull] = SELF_SUPPORTING_C[index]
  const fast = fastOrNull ?? medium
  // `!(rate > 15)` also catches NaN and non-positive rates, which have no logarithm.
  if (!(rate > 15)) return slow
  if (rate >= 150) return fast
  const logRate = Math.log(rate)
  if (rate <= 60) return slow + ((medium - slow) * (logRate - LOG_15)) / (LOG_60 - LOG_15)
  return medium + ((fast - medium) * (logRate - LOG_60)) / (LOG_150 - LOG_60)
}

/**
 * Temperature (°C) at which a self-supporting cone bends when the last 100 °C are climbed at
 * finalRateCPerHour: the table's columns interpolated on log(rate), clamped outside 15–150 °C/h.
 */
export function coneTemperatureC(cone: Cone, finalRateCPerHour = 60): number {
  return temperatureAtIndex(coneIndex(cone), finalRateCPerHour)
}

/** The hottest cone fully down when the kiln peaks at peakC after climbing at that rate; null if none. */
export function coneReached(peakC: number, finalRateCPerHour = 60): Cone | null {
  // Each column rises strictly with the cone number, so the first cone above the peak ends the search.
  let reached: Cone | null = null
  for (let index = 0; index < CONES.length; index++) {
    if (!(temperatureAtIndex(index, finalRateCPerHour) <= peakC)) break
    reached = CONES[index]
  }
  return reached
}
