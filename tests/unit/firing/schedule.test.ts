import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { FiringKind, Kiln, Piece, PieceForm } from '../../../shared/firing/check'
import { CONES, coneTemperatureC } from '../../../shared/firing/cones'
import {
  COOLING_PROFILES,
  planSchedule,
  zoneLabel,
  type CoolingProfile,
  type FiringSchedule,
  type Segment,
} from '../../../shared/firing/schedule'
import { fToC } from '../../../shared/firing/units'
import { electricKiln, greenBowl, mug } from './fixtures'

const KINDS: FiringKind[] = ['bisque', 'glaze', 'single', 'lustre', 'raku']

function heating(schedule: FiringSchedule): Segment[] {
  return schedule.segments.filter((segment) => segment.toC > segment.fromC)
}

function cooling(schedule: FiringSchedule): Segment[] {
  return schedule.segments.filter((segment) => segment.toC < segment.fromC)
}

/** Segments whose span includes the temperature (both, when it falls on a boundary). */
function crossing(segments: Segment[], celsius: number): Segment[] {
  return segments.filter((segment) => Math.min(segment.fromC, segment.toC) <= celsius && celsius <= Math.max(segment.fromC, segment.toC))
}

const kilnArbitrary = fc.record({
  maxRampCPerHour: fc.double({ min: 1, max: 2000, noNaN: true }),
  preheatHold: fc.boolean(),
  controlledCooling: fc.boolean(),
})

const loadArbitrary = fc.array(
  fc.record({
    state: fc.constantFrom<Piece['state']>('greenware', 'bisque', 'glazed'),
    wallThicknessMm: fc.double({ min: 0.5, max: 200, noNaN: true }),
    form: fc.constantFrom<PieceForm | undefined>('open', 'closed', 'solid', undefined),
  }),
  { maxLength: 6 },
)

const requestArbitrary = fc.record({
  kind: fc.constantFrom(...KINDS),
  cone: fc.constantFrom(...CONES),
  kiln: kilnArbitrary,
  pieces: loadArbitrary,
  slowCool: fc.boolean(),
  cooling: fc.constantFrom<CoolingProfile>(...COOLING_PROFILES),
})

describe('planSchedule, for any kiln and load', () => {
  it('never runs faster than the kiln allows, and every rate is positive', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        for (const segment of planSchedule(request).segments) {
          expect(segment.rateCPerHour).toBeGreaterThan(0)
          // Raku ware pulled hot cools outside the kiln, at no rate the kiln sets.
          if (segment.zone !== 'pulled-hot') expect(segment.rateCPerHour).toBeLessThanOrEqual(request.kiln.maxRampCPerHour)
          expect(segment.holdMinutes).toBeGreaterThanOrEqual(0)
        }
      }),
    )
  })

  it('runs contiguously from 20 °C up to the peak and back down to about 50 °C', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        const schedule = planSchedule(request)
        const { segments } = schedule
        expect(segments[0].fromC).toBe(20)
        for (let i = 1; i < segments.length; i++) expect(segments[i].fromC).toBe(segments[i - 1].toC)
        // Up, then down: one turn, at the peak.
        const up = heating(schedule)
        const down = cooling(schedule)
        expect(up.length + down.length).toBe(segments.length)
        expect(segments.slice(0, up.length)).toEqual(up)
        expect(up.at(-1)?.toC).toBe(schedule.peakC)
        // Kept shut to about 50 °C / 125 °F, well below the 500 °F at which opening cracks ware (common practice).
        expect(segments.at(-1)?.toC).toBe(50)
        expect(segments.at(-1)?.toC).toBeLessThan(fToC(500))
      }),
    )
  })

  it('predicts the requested cone at the planned final rate', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        const schedule = planSchedule(request)
        expect(schedule.predictedCone).toBe(request.cone)
        const final = schedule.segments.find((segment) => segment.zone === 'final-100')
        expect(final?.rateCPerHour).toBe(schedule.finalRateCPerHour)
        expect(final?.toC).toBe(schedule.peakC)
        expect(schedule.peakC).toBeGreaterThanOrEqual(coneTemperatureC(request.cone, schedule.finalRateCPerHour))
      }),
    )
  })

  it('climbs through the quartz inversion (573 °C, about 1 % volume change) slower than its fastest climb', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        const schedule = planSchedule(request)
        const fastest = Math.max(...heating(schedule).map((segment) => segment.rateCPerHour))
        const halfKiln = request.kiln.maxRampCPerHour / 2
        const atInversion = crossing(heating(schedule), 573)
        expect(atInversion.length).toBeGreaterThan(0)
        for (const segment of atInversion) {
          // At most half the kiln's fastest ramp, and slower than the rest of the climb, unless thick ware
          // already holds the whole climb at or below that (a 13 mm greenware pot in a raku kiln, say).
          expect(segment.rateCPerHour).toBeLessThanOrEqual(halfKiln)
          if (fastest > halfKiln) expect(segment.rateCPerHour).toBeLessThan(fastest)
        }
      }),
    )
  })

  it('adds up its time: ramps at their rates plus holds', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        const schedule = planSchedule(request)
        const minutes = schedule.segments.reduce(
          (sum, segment) => sum + (Math.abs(segment.toC - segment.fromC) * 60) / segment.rateCPerHour + segment.holdMinutes,
          0,
        )
        expect(Math.abs(schedule.totalMinutes - minutes)).toBeLessThanOrEqual(0.5)
      }),
    )
  })

  it('names a zone with a label for every segment', () => {
    fc.assert(
      fc.property(requestArbitrary, (request) => {
        for (const segment of planSchedule(request).segments) expect(zoneLabel(segment.zone)).toMatch(/\w/)
      }),
    )
  })
})

describe('water smoking and candling', () => {
  it('candles greenware below boiling, at 80–95 °C (common practice), so no water inside turns to steam', () => {
    for (const kind of ['bisque', 'single'] as const) {
      const schedule = planSchedule({ kind, cone: '04', kiln: electricKiln(), pieces: [greenBowl()] })
      const holds = schedule.segments.filter((segment) => segment.holdMinutes > 0 && segment.toC <= 130)
      expect(holds.length).toBe(1)
      expect(holds[0].zone).toBe('candling')
      expect(holds[0].toC).toBeGreaterThanOrEqual(80)
      expect(holds[0].toC).toBeLessThanOrEqual(95)
      expect(holds[0].toC).toBeLessThan(100)
    }
  })

  it('climbs slowly while held water leaves, up to about 200 °C (common practice)', () => {
    const schedule = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl()] })
    const wet = heating(schedule).filter((segment) => segment.fromC < 200)
    const ramp = schedule.segments.find((segment) => segment.zone === 'ramp')
    expect(wet.at(-1)?.toC).toBe(200)
    for (const segment of wet) {
      expect(['candling', 'water-smoking']).toContain(segment.zone)
      expect(segment.rateCPerHour).toBeLessThan(ramp?.rateCPerHour ?? 0)
    }
  })

  it('gives thicker walls a preheat never shorter and a first climb never faster', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        fc.constantFrom(...KINDS),
        kilnArbitrary,
        (a, b, kind, kiln) => {
          const [thin, thick] = a <= b ? [a, b] : [b, a]
          const plan = (wall: number) =>
            planSchedule({
              kind,
              cone: '6',
              kiln,
              pieces: [{ state: kind === 'bisque' || kind === 'single' ? 'greenware' : 'bisque', wallThicknessMm: wall }],
            })
          const thinPlan = plan(thin)
          const thickPlan = plan(thick)
          expect(thickPlan.candlingHoldMinutes).toBeGreaterThanOrEqual(thinPlan.candlingHoldMinutes)
          expect(thickPlan.segments[0].rateCPerHour).toBeLessThanOrEqual(thinPlan.segments[0].rateCPerHour)
        },
      ),
    )
  })

  it('does not hold when the kiln cannot, and climbs the water-smoking range slower instead', () => {
    const can = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl()] })
    const cannot = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln({ preheatHold: false }), pieces: [greenBowl()] })
    expect(cannot.candlingHoldMinutes).toBe(0)
    expect(cannot.segments.every((segment) => segment.toC > 130 || segment.holdMinutes === 0)).toBe(true)
    expect(cannot.segments[0].rateCPerHour).toBeLessThan(can.segments[0].rateCPerHour)
  })

  it('does not candle bisqued ware in a glaze firing', () => {
    const schedule = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()] })
    expect(schedule.candlingHoldMinutes).toBe(0)
    expect(schedule.segments.some((segment) => segment.zone === 'candling')).toBe(false)
  })
})

describe('bisque: dehydroxylation and burnout', () => {
  const bisque = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl()] })
  const glaze = planSchedule({ kind: 'glaze', cone: '04', kiln: electricKiln(), pieces: [mug()] })

  it('climbs slowly where bound water leaves (about 480–540 °C, common practice)', () => {
    for (const celsius of [490, 520, 535]) {
      const [segment] = crossing(heating(bisque), celsius)
      expect(segment.zone).toBe('dehydroxylation')
      expect(segment.rateCPerHour).toBeLessThan(crossing(heating(glaze), celsius)[0].rateCPerHour)
    }
  })

  it('climbs slowly while organics, sulfur and fluorine burn out (roughly 700–870 °C, 1300–1600 °F, common practice)', () => {
    for (const celsius of [fToC(1300), 780, fToC(1590)]) {
      const [segment] = crossing(heating(bisque), celsius)
      expect(segment.zone).toBe('burnout')
      expect(segment.rateCPerHour).toBeLessThan(crossing(heating(glaze), celsius)[0].rateCPerHour)
    }
    const burnout = bisque.segments.filter((segment) => segment.zone === 'burnout')
    expect(Math.max(...burnout.map((segment) => segment.toC))).toBe(870)
  })

  it('marks the quartz inversion band on the way up', () => {
    expect(crossing(heating(bisque), 573)[0].zone).toBe('quartz-inversion')
    expect(crossing(heating(glaze), 573)[0].zone).toBe('quartz-inversion')
  })
})

describe('the end of the climb', () => {
  it('climbs the last 100 °C at the cone-setting rate, within the kiln’s limit', () => {
    const schedule = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()] })
    const final = schedule.segments.find((segment) => segment.zone === 'final-100') as Segment
    expect(final.toC - final.fromC).toBe(100)
    expect(final.rateCPerHour).toBe(60)
    // Chart: cone 6 at 60 °C/h is 1222 °C.
    expect(schedule.peakC).toBe(1222)
    expect(final.holdMinutes).toBeGreaterThan(0)

    const slowKiln = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln({ maxRampCPerHour: 40 }), pieces: [mug()] })
    expect(slowKiln.finalRateCPerHour).toBe(40)
    expect(slowKiln.predictedCone).toBe('6')
    // Slower final climb, more heat work, so the cone bends cooler (chart: 1185 °C at 15 °C/h, 1222 at 60).
    expect(slowKiln.peakC).toBeLessThan(1222)
    expect(slowKiln.peakC).toBeGreaterThan(1185)
  })
})

describe('cooling', () => {
  const thick = greenBowl({ state: 'bisque', boneDry: undefined, wallThicknessMm: 20 })

  it('slows through the quartz (573 °C) and cristobalite (about 220 °C, about 3 % contraction) inversions when asked and able', () => {
    const natural = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()] })
    const slow = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()], slowCool: true })
    expect(natural.controlledCooling).toBe(false)
    expect(slow.controlledCooling).toBe(true)
    for (const celsius of [573, 220]) {
      const [slowSegment] = crossing(cooling(slow), celsius)
      const [naturalSegment] = crossing(cooling(natural), celsius)
      expect(slowSegment.zone).toBe(celsius === 573 ? 'quartz-inversion-cool' : 'cristobalite-cool')
      expect(naturalSegment.zone).toBe(slowSegment.zone)
      expect(slowSegment.rateCPerHour).toBeLessThan(naturalSegment.rateCPerHour)
    }
    expect(slow.totalMinutes).toBeGreaterThan(natural.totalMinutes)
  })

  it('slow-cools thick walls without being asked, when the kiln can', () => {
    expect(planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [thick] }).controlledCooling).toBe(true)
  })

  it('cools naturally when the kiln cannot control its cooling', () => {
    const schedule = planSchedule({
      kind: 'glaze',
      cone: '6',
      kiln: electricKiln({ controlledCooling: false }),
      pieces: [thick],
      slowCool: true,
    })
    const natural = planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()] })
    expect(schedule.controlledCooling).toBe(false)
    expect(cooling(schedule)).toEqual(cooling(natural))
  })
})

describe('a kiln that climbs slowly', () => {
  it('still runs slower through the quartz inversion than elsewhere', () => {
    const kiln: Pick<Kiln, 'maxRampCPerHour' | 'preheatHold' | 'controlledCooling'> = {
      maxRampCPerHour: 50,
      preheatHold: true,
      controlledCooling: false,
    }
    const schedule = planSchedule({ kind: 'glaze', cone: '022', kiln, pieces: [mug()] })
    const fastest = Math.max(...heating(schedule).map((segment) => segment.rateCPerHour))
    expect(crossing(heating(schedule), 573)[0].rateCPerHour).toBeLessThan(fastest)
    expect(schedule.predictedCone).toBe('022')
  })
})

/** The heating rate the plan runs at this temperature (the slower one on a boundary). */
function rateAt(schedule: FiringSchedule, celsius: number): number {
  return Math.min(...crossing(heating(schedule), celsius).map((segment) => segment.rateCPerHour))
}

const SAMPLE_TEMPERATURES_C = [...Array.from({ length: 63 }, (_, i) => 21 + i * 10), 650] // 21 … 641 and 650 °C

describe('thickness-aware heating', () => {
  const wall = fc.double({ min: 0.5, max: 120, noNaN: true })
  const request = fc.record({
    kind: fc.constantFrom(...KINDS),
    cone: fc.constantFrom(...CONES),
    kiln: kilnArbitrary,
    state: fc.constantFrom<Piece['state']>('greenware', 'bisque', 'glazed'),
    form: fc.constantFrom<PieceForm>('open', 'closed', 'solid'),
    others: loadArbitrary,
  })

  it('never gives a thicker wall a faster rate, in any band up to 650 °C (property)', () => {
    fc.assert(
      fc.property(request, wall, wall, ({ kind, cone, kiln, state, form, others }, a, b) => {
        const [thin, thick] = a <= b ? [a, b] : [b, a]
        const plan = (wallThicknessMm: number) => planSchedule({ kind, cone, kiln, pieces: [...others, { state, form, wallThicknessMm }] })
        const thinPlan = plan(thin)
        const thickPlan = plan(thick)
        for (const celsius of SAMPLE_TEMPERATURES_C) {
          if (celsius > thinPlan.peakC || celsius > thickPlan.peakC) continue
          expect(rateAt(thickPlan, celsius)).toBeLessThanOrEqual(rateAt(thinPlan, celsius))
        }
      }),
    )
  })

  it('takes walls of 25 mm and over no faster than 55 °C/h up to 650 °C (thick ware at 30–55 °C/h, common practice; from memory)', () => {
    fc.assert(
      fc.property(request, fc.double({ min: 25, max: 200, noNaN: true }), ({ kind, cone, kiln, state, form, others }, thick) => {
        const schedule = planSchedule({ kind, cone, kiln, pieces: [...others, { state, form, wallThicknessMm: thick }] })
        for (const celsius of SAMPLE_TEMPERATURES_C) {
          if (celsius > schedule.peakC) continue
          expect(rateAt(schedule, celsius)).toBeLessThanOrEqual(55)
        }
      }),
    )
  })

  it('takes thick-wall bisque at roughly 30–55 °C/h to about 540 °C (common practice; from memory)', () => {
    const schedule = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl({ wallThicknessMm: 25 })] })
    for (const celsius of [210, 300, 400, 500, 540]) {
      expect(rateAt(schedule, celsius)).toBeGreaterThanOrEqual(30)
      expect(rateAt(schedule, celsius)).toBeLessThanOrEqual(55)
    }
  })

  it('takes a thick pot through quartz slower than a 6 mm pot', () => {
    const plan = (wallThicknessMm: number) =>
      planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl({ wallThicknessMm })] })
    expect(rateAt(plan(20), 573)).toBeLessThan(rateAt(plan(6), 573))
    expect(rateAt(plan(20), 300)).toBeLessThan(rateAt(plan(6), 300))
  })

  it('takes closed and solid forms slower than open ones of the same wall, and candles them longer', () => {
    const plan = (form: PieceForm) =>
      planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl({ wallThicknessMm: 10, form })] })
    const [open, closed, solid] = [plan('open'), plan('closed'), plan('solid')]
    for (const celsius of [150, 300, 520, 573]) {
      expect(rateAt(closed, celsius)).toBeLessThan(rateAt(open, celsius))
      expect(rateAt(solid, celsius)).toBeLessThanOrEqual(rateAt(closed, celsius))
    }
    expect(closed.candlingHoldMinutes).toBeGreaterThan(open.candlingHoldMinutes)
    expect(solid.candlingHoldMinutes).toBeGreaterThan(closed.candlingHoldMinutes)
  })

  it('candles longer for a thicker wall: about an hour per 6 mm (common practice)', () => {
    const plan = (wallThicknessMm: number) =>
      planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl({ wallThicknessMm })] })
    expect(plan(6).candlingHoldMinutes).toBe(60)
    expect(plan(12).candlingHoldMinutes).toBe(120)
    expect(plan(24).candlingHoldMinutes).toBe(240)
  })
})

describe('glaze cooling profiles', () => {
  const plan = (cooling: CoolingProfile, controlledCooling = true) =>
    planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln({ controlledCooling }), pieces: [mug()], cooling })

  it('cools through glaze development, about 1040 → 760 °C, at 70–85 °C/h when asked (common practice)', () => {
    const schedule = plan('glaze-development')
    const slow = schedule.segments.find((segment) => segment.zone === 'glaze-development-cool') as Segment
    expect(slow.fromC).toBe(1040)
    expect(slow.toC).toBe(760)
    expect(slow.rateCPerHour).toBeGreaterThanOrEqual(70)
    expect(slow.rateCPerHour).toBeLessThanOrEqual(85)
    expect(slow.estimate).toBeUndefined()
    expect(schedule.cooling).toBe('glaze-development')
    expect(schedule.totalMinutes).toBeGreaterThan(plan('natural').totalMinutes)
  })

  it('drops about 55 °C (100 °F) from the peak and holds there when asked (common practice)', () => {
    const schedule = plan('drop-and-hold')
    const drop = schedule.segments.find((segment) => segment.zone === 'drop-and-hold') as Segment
    expect(drop.fromC).toBe(schedule.peakC)
    expect(drop.fromC - drop.toC).toBe(55)
    expect(drop.holdMinutes).toBeGreaterThanOrEqual(15)
  })

  it('marks the kiln’s own cooling as an estimate, never as a step to program', () => {
    const natural = plan('natural')
    for (const segment of cooling(natural)) expect(segment.estimate).toBe(true)
    for (const segment of heating(natural)) expect(segment.estimate).toBeUndefined()
  })

  it('falls back to a natural cool in a kiln that cannot control its cooling, and in bisque', () => {
    expect(plan('glaze-development', false).cooling).toBe('natural')
    expect(
      planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl()], cooling: 'drop-and-hold' }).cooling,
    ).toBe('natural')
  })
})

describe('lustre and raku schedules', () => {
  const glazedMug = mug({ state: 'glazed' })

  it('fires lustre to a low cone with a vented burnout below about 550 °C (common practice)', () => {
    const schedule = planSchedule({ kind: 'lustre', cone: '018', kiln: electricKiln(), pieces: [glazedMug] })
    expect(schedule.predictedCone).toBe('018')
    expect(schedule.segments[0].zone).toBe('burnout')
    // Chart: cone 018 at 60 °C/h is 715 °C.
    expect(schedule.peakC).toBeLessThan(720)
    const climbMinutes = heating(schedule).reduce((sum, segment) => sum + ((segment.toC - segment.fromC) / segment.rateCPerHour) * 60, 0)
    expect(climbMinutes).toBeLessThan(6 * 60)
  })

  it('climbs raku fast and pulls it hot: hours, not the day of an electric glaze firing', () => {
    const rakuKiln = electricKiln({ kind: 'raku', maxRampCPerHour: 600, controlledCooling: false })
    const raku = planSchedule({
      kind: 'raku',
      cone: '06',
      kiln: rakuKiln,
      pieces: [mug({ clay: { body: 'raku', minCone: '010', maxCone: '04' } })],
    })
    const glaze = planSchedule({ kind: 'glaze', cone: '06', kiln: rakuKiln, pieces: [mug()] })
    expect(raku.totalMinutes).toBeLessThan(6 * 60)
    expect(raku.totalMinutes).toBeLessThan(glaze.totalMinutes / 2)
    expect(raku.segments.at(-1)?.zone).toBe('pulled-hot')
    expect(raku.finalRateCPerHour).toBe(150)
  })
})
