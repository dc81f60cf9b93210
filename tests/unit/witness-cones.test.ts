import { describe, expect, it } from 'vitest'
import { coneFromWitnesses, crossCheckCones } from '../../shared/firing/witness'

// A witness pack of three cones (guide, firing, guard) is common practice: the firing cone at
// 3 o'clock with the cooler guide cone touching and the hotter guard standing is a cone on target.
describe('the cone reached, from witness cones', () => {
  it('reads a classic pack 5-6-7 with 6 at 3 o’clock as cone 6', () => {
    expect(
      coneFromWitnesses([
        { cone: '5', bend: 'touching' },
        { cone: '6', bend: 'three-oclock' },
        { cone: '7', bend: 'standing' },
      ]),
    ).toBe('6')
  })

  it('takes the hottest cone that came down, in cone order (06 is cooler than 6)', () => {
    expect(
      coneFromWitnesses([
        { cone: '6', bend: 'touching' },
        { cone: '06', bend: 'touching' },
      ]),
    ).toBe('6')
    expect(
      coneFromWitnesses([
        { cone: '04', bend: 'three-oclock' },
        { cone: '03', bend: 'standing' },
      ]),
    ).toBe('04')
  })

  it('says nothing was reached when every cone stands', () => {
    expect(
      coneFromWitnesses([
        { cone: '9', bend: 'standing' },
        { cone: '10', bend: 'standing' },
      ]),
    ).toBeNull()
  })
})

describe('cross-checking the cones with the peak', () => {
  it('agrees when the peak and final rate give the same cone: 1222 °C at 60 °C/h is cone 6 on the Orton self-supporting chart', () => {
    const check = crossCheckCones(
      [
        { cone: '6', bend: 'three-oclock' },
        { cone: '7', bend: 'standing' },
      ],
      { peakC: 1222, finalRateCPerHour: 60 },
    )
    expect(check).toMatchObject({ fromCones: '6', fromCurve: '6', agree: true, inconsistent: false })
  })

  it('flags a thermocouple reading more than one cone from the cones', () => {
    // Orton self-supporting, 60 °C/h: cone 6 1222 °C, cone 9 1260 °C; a 1262 °C peak predicts cone 9.
    const check = crossCheckCones(
      [
        { cone: '6', bend: 'three-oclock' },
        { cone: '7', bend: 'standing' },
      ],
      { peakC: 1262, finalRateCPerHour: 60 },
    )
    expect(check.fromCurve).toBe('9')
    expect(check.agree).toBe(false)
    expect(check.message).toMatch(/thermocouple/)
  })

  it('marks readings that cannot both be true: a hotter cone further down than a cooler one', () => {
    expect(
      crossCheckCones(
        [
          { cone: '5', bend: 'standing' },
          { cone: '6', bend: 'touching' },
        ],
        {},
      ).inconsistent,
    ).toBe(true)
  })
})
