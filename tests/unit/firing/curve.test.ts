import { describe, expect, it } from 'vitest'
import { CRITICAL_ZONES, curveFlags, curveOfReadings } from '../../../shared/firing/curve'
import { coneFromCurve } from '../../../shared/firing/heatwork'
import { guessMapping, mapReadings, parseCsv } from '../../../shared/firing/readings'
import { planSchedule } from '../../../shared/firing/schedule'
import { electricKiln, greenBowl, mug } from './fixtures'

describe('critical zones', () => {
  it('bracket the quartz inversion at 573 °C and the cristobalite inversion near 220 °C (common practice)', () => {
    const quartzUp = CRITICAL_ZONES.find((z) => z.id === 'quartz-heating')!
    const quartzDown = CRITICAL_ZONES.find((z) => z.id === 'quartz-cooling')!
    const cristobalite = CRITICAL_ZONES.find((z) => z.id === 'cristobalite-cooling')!
    for (const zone of [quartzUp, quartzDown]) {
      expect(zone.lowC).toBeLessThan(573)
      expect(zone.highC).toBeGreaterThan(573)
    }
    expect(cristobalite.lowC).toBeLessThan(220)
    expect(cristobalite.highC).toBeGreaterThan(220)
    // Water boils at 100 °C; physically held water leaves up to about 200 °C (common practice).
    expect(CRITICAL_ZONES.find((z) => z.id === 'water-smoking')!.highC).toBeGreaterThanOrEqual(100)
  })
})

describe('curveFlags', () => {
  const plan = planSchedule({ kind: 'bisque', cone: '04', kiln: electricKiln(), pieces: [greenBowl()] })

  it('flags nothing for a log that follows the plan', () => {
    let minute = 0
    const points = [{ minute: 0, tempC: plan.segments[0].fromC }]
    for (const segment of plan.segments) {
      minute += (Math.abs(segment.toC - segment.fromC) / segment.rateCPerHour) * 60
      points.push({ minute, tempC: segment.toC })
      minute += segment.holdMinutes
      points.push({ minute, tempC: segment.toC })
    }
    expect(curveFlags(plan, points)).toEqual([])
  })

  it('flags a climb through quartz and a cool through cristobalite faster than the plan allowed, with the rates', () => {
    const points = [
      { minute: 0, tempC: 20 },
      { minute: 600, tempC: 540 },
      // 540 → 610 °C in 20 minutes: 210 °C/h through quartz.
      { minute: 620, tempC: 610 },
      { minute: 900, tempC: 1000 },
      { minute: 1300, tempC: 300 },
      // 300 → 150 °C in 30 minutes: the kiln was opened through cristobalite.
      { minute: 1330, tempC: 150 },
    ]
    const flags = curveFlags(plan, points)
    const quartz = flags.find((f) => f.zone === 'quartz-heating')!
    expect(quartz.rateCPerHour).toBeCloseTo(210, 6)
    expect(quartz.allowedCPerHour).toBeLessThan(100)
    expect(quartz.message).toMatch(/Quartz inversion/)
    const cristobalite = flags.find((f) => f.zone === 'cristobalite-cooling')!
    expect(cristobalite.rateCPerHour).toBeCloseTo(300, 6)
    expect(cristobalite.direction).toBe('cooling')
  })

  it('merges neighbouring fast stretches in one zone into one flag', () => {
    const points = [
      { minute: 0, tempC: 20 },
      { minute: 20, tempC: 80 },
      { minute: 40, tempC: 140 },
      { minute: 60, tempC: 200 },
    ]
    const flags = curveFlags(plan, points).filter((f) => f.zone === 'water-smoking')
    expect(flags).toHaveLength(1)
    expect(flags[0].fromMinute).toBe(0)
    expect(flags[0].toMinute).toBe(60)
  })
})

describe('a controller CSV export, mapped and read', () => {
  // An invented export: elapsed h:mm, °F, a set-point column to ignore.
  const csv = ['Elapsed,Setpoint (F),Temp (F)', '0:00,70,68', '1:00,250,248', '2:00,400,"401"', '3:00,oops,x', '4:00,1000,1001'].join('\n')

  it('finds the header, the columns and the unit, and converts °F to °C (t/°C = (t/°F − 32)/1.8, NIST SP 811)', () => {
    const table = parseCsv(csv)
    expect(table.header).toEqual(['Elapsed', 'Setpoint (F)', 'Temp (F)'])
    const mapping = guessMapping(table)
    expect(mapping).toMatchObject({ timeColumn: 0, timeFormat: 'elapsed-hms', tempColumn: 2, unit: 'F' })
    const start = Date.parse('2026-03-04T08:00:00Z')
    const { readings, skipped } = mapReadings(table, mapping, { startMs: start, midnightMs: start })
    expect(readings[1]).toEqual({ at: '2026-03-04T09:00:00.000Z', tempC: 120 })
    expect(readings.at(-1)?.tempC).toBeCloseTo((1001 - 32) / 1.8, 1)
    expect(skipped).toEqual([{ row: 5, reason: '“x” is not a temperature.' }])
  })

  it('rolls clock times past midnight and reads semicolon files with decimal commas', () => {
    const table = parseCsv('Time;Temp °C\n23:30;610,5\n00:15;650,0')
    const mapping = guessMapping(table)
    expect(mapping.timeFormat).toBe('clock')
    const midnight = Date.parse('2026-03-04T00:00:00Z')
    const { readings } = mapReadings(table, mapping, { startMs: midnight, midnightMs: midnight })
    expect(readings).toEqual([
      { at: '2026-03-04T23:30:00.000Z', tempC: 610.5 },
      { at: '2026-03-05T00:15:00.000Z', tempC: 650 },
    ])
  })

  it('gives the cone of a logged cone 6 curve from the readings', () => {
    // A steady 60 °C/h climb to 1222 °C, logged every hour: chart cone 6.
    const readings = Array.from({ length: 21 }, (_, h) => ({
      at: new Date(Date.UTC(2026, 2, 4, h)).toISOString(),
      tempC: Math.min(1222, 20 + 60 * h),
    }))
    readings.push({ at: new Date(Date.UTC(2026, 2, 4, 20, 2)).toISOString(), tempC: 1222 })
    const curve = curveOfReadings(readings)
    expect(curve[1]).toEqual({ minute: 60, tempC: 80 })
    expect(coneFromCurve(curve).cone).toBe('6')
    expect(curveFlags(planSchedule({ kind: 'glaze', cone: '6', kiln: electricKiln(), pieces: [mug()] }), curve)).toEqual([])
  })
})
