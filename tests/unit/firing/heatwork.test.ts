import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { CHARTED_CONES, chartedTemperaturesC, coneStep, coneTemperatureC } from '../../../shared/firing/cones'
import { coneFromCurve, steadyCurve, type CurvePoint } from '../../../shared/firing/heatwork'

// Source: Orton Ceramic Foundation, "Temperature Equivalent Chart for Orton Pyrometric Cones (°C)",
// self-supporting cones, regular, 15 / 60 / 150 °C/h over the last 100 °C (the chart as transcribed
// in shared/firing/cones.ts and checked value by value in cones.test.ts). 022–020 print no 150 °C/h value.
const CHART: Record<string, [number, number, number | null]> = {
  '022': [586, 590, null],
  '019': [656, 678, 695],
  '015': [750, 791, 818],
  '010': [891, 903, 915],
  '06': [981, 998, 1013],
  '04': [1046, 1063, 1077],
  '1': [1109, 1137, 1154],
  '2': [1112, 1142, 1164],
  '3': [1115, 1152, 1170],
  '5': [1159, 1186, 1207],
  '6': [1185, 1222, 1243],
  '10': [1251, 1285, 1305],
  '14': [1351, 1365, 1384],
}
const RATES = [15, 60, 150] as const

describe('coneFromCurve reproduces the published chart', () => {
  it.each(Object.entries(CHART))(
    'a steady climb ending at cone %s’s charted temperature gives cone %s at 15, 60 and 150 °C/h',
    (cone, row) => {
      RATES.forEach((rate, column) => {
        const tempC = row[column]
        if (tempC === null) return
        expect(coneFromCurve(steadyCurve(tempC, rate)).cone).toBe(cone)
      })
    },
  )

  it('gives every charted cone at every column of the chart (the whole table, as transcribed)', () => {
    for (const cone of CHARTED_CONES) {
      RATES.forEach((rate, column) => {
        const tempC = chartedTemperaturesC(cone)![column]
        if (tempC !== null) expect(coneFromCurve(steadyCurve(tempC, rate)).cone).toBe(cone)
      })
    }
  })

  it('stays within one cone of the chart between its columns (interpolated on log rate)', () => {
    for (const cone of CHARTED_CONES.slice(3)) {
      for (const rate of [25, 40, 90, 120]) {
        const got = coneFromCurve(steadyCurve(coneTemperatureC(cone, rate), rate)).cone
        expect(got).not.toBeNull()
        expect(Math.abs(coneStep(got!) - coneStep(cone))).toBeLessThanOrEqual(1)
      }
    }
  })

  it('counts a hold: 30 minutes at 1207 °C after a 60 °C/h climb brings cone 6 down (cone 5 without it)', () => {
    // Chart: cone 5 at 1186, cone 6 at 1222 °C for 60 °C/h; a soak does the heat work of a hotter peak.
    expect(coneFromCurve(steadyCurve(1207, 60)).cone).toBe('5')
    expect(coneFromCurve(steadyCurve(1207, 60, 30)).cone).toBe('6')
  })

  it('counts a slow cool as heat work too', () => {
    const peak: CurvePoint[] = steadyCurve(1215, 60)
    const end = peak.at(-1)!
    const slowCool = [...peak, { minute: end.minute + 60, tempC: 1160 }]
    expect(coneStep(coneFromCurve(slowCool).cone!)).toBeGreaterThanOrEqual(coneStep(coneFromCurve(peak).cone!))
  })

  it('says null for a curve too cool for cone 022 and skips readings out of time order', () => {
    expect(coneFromCurve(steadyCurve(500, 60)).cone).toBeNull()
    const curve = [...steadyCurve(1222, 60), { minute: 5, tempC: 1400 }]
    expect(coneFromCurve(curve).cone).toBe('6')
  })
})

describe('a hold never lowers the cone (property)', () => {
  it('adding a hold anywhere on a curve never gives a cooler cone', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 600, max: 1380, noNaN: true }),
        fc.double({ min: 10, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 1, max: 240, noNaN: true }),
        (peakC, rate, where, holdMinutes) => {
          const curve = steadyCurve(peakC, rate)
          const at = where * curve[1].minute
          const tempAt = 20 + ((peakC - 20) * at) / curve[1].minute
          const held: CurvePoint[] = [
            curve[0],
            { minute: at, tempC: tempAt },
            { minute: at + holdMinutes, tempC: tempAt },
            { minute: curve[1].minute + holdMinutes, tempC: peakC },
          ]
          const without = coneFromCurve(curve).cone
          const withHold = coneFromCurve(held).cone
          if (without === null) return
          expect(withHold).not.toBeNull()
          expect(coneStep(withHold!)).toBeGreaterThanOrEqual(coneStep(without))
        },
      ),
    )
  })
})
