import { describe, expect, it } from 'vitest'
import { crossCheckCones, readPositions } from '../../../shared/firing/witness'

// A witness pack of three cones (guide, firing, guard) at each position is common practice; the firing
// cone with its tip level with its base is the cone reached there.
describe('witness cones read per position', () => {
  const packs = [
    { cone: '5', bend: 'touching', position: 'Top' },
    { cone: '6', bend: 'three-oclock', position: 'Top' },
    { cone: '7', bend: 'bending', position: 'Top' },
    { cone: '5', bend: 'three-oclock', position: 'Bottom' },
    { cone: '6', bend: 'bending', position: 'Bottom' },
    { cone: '7', bend: 'standing', position: 'Bottom' },
  ] as const

  it('reads each position on its own and names the coolest and hottest', () => {
    const positions = readPositions([...packs])
    expect(positions.map((p) => [p.position, p.reached, p.bending])).toEqual([
      ['Top', '6', '7'],
      ['Bottom', '5', '6'],
    ])
    const check = crossCheckCones([...packs], { peakC: 1222, finalRateCPerHour: 60, holdMinutes: 0 }, '6')
    expect(check.coolest?.position).toBe('Bottom')
    expect(check.hottest?.position).toBe('Top')
    expect(check.fromCones).toBe('5')
    expect(check.coldSpotReached).toBe(false)
    expect(check.message).toMatch(/cold spot did not reach cone 6/)
  })

  it('accepts a hold: cone 6 down after a 60 °C/h climb to 1207 °C and 30 minutes there is no thermocouple problem', () => {
    const check = crossCheckCones(
      [
        { cone: '5', bend: 'touching' },
        { cone: '6', bend: 'three-oclock' },
        { cone: '7', bend: 'standing' },
      ],
      { peakC: 1207, finalRateCPerHour: 60, holdMinutes: 30 },
      '6',
    )
    expect(check.fromCurve).toBe('6')
    expect(check.agree).toBe(true)
    expect(check.coldSpotReached).toBe(true)
    expect(check.message).not.toMatch(/thermocouple/)
  })

  it('allows one cone either way before it suggests a thermocouple check', () => {
    const cones = [{ cone: '6', bend: 'three-oclock' } as const]
    // Chart, 60 °C/h: cone 5 at 1186, cone 6 at 1222, cone 8 at 1249 °C.
    expect(crossCheckCones(cones, { peakC: 1186, finalRateCPerHour: 60 }).agree).toBe(true)
    const far = crossCheckCones(cones, { peakC: 1249, finalRateCPerHour: 60 })
    expect(far.fromCurve).toBe('8')
    expect(far.agree).toBe(false)
    expect(far.message).toMatch(/thermocouple/)
  })

  it('prefers the logged curve over the peak when there is one', () => {
    const curve = [
      { minute: 0, tempC: 20 },
      { minute: ((1222 - 20) / 60) * 60, tempC: 1222 },
    ]
    expect(crossCheckCones([{ cone: '6', bend: 'three-oclock' }], { curve, peakC: 900, finalRateCPerHour: 60 }).fromCurve).toBe('6')
  })

  it('finds readings that cannot be true at one position, and not across positions', () => {
    expect(
      crossCheckCones(
        [
          { cone: '5', bend: 'standing', position: 'Top' },
          { cone: '6', bend: 'touching', position: 'Top' },
        ],
        {},
      ).inconsistent,
    ).toBe(true)
    expect(
      crossCheckCones(
        [
          { cone: '5', bend: 'standing', position: 'Top' },
          { cone: '6', bend: 'touching', position: 'Bottom' },
        ],
        {},
      ).inconsistent,
    ).toBe(false)
  })
})
