// The schedule as a chart reads it: temperature against elapsed hours, and the span of each zone.

import { ROOM_C, zoneLabel, type FiringSchedule, type SegmentZone } from '../../../shared/firing/schedule'
import { rateCToF } from '../../../shared/firing/units'
import type { TemperatureScale } from '../../lib/units'

export interface CurvePoint {
  hours: number
  temperatureC: number
}

export interface ZoneSpan {
  zone: SegmentZone
  fromHours: number
  toHours: number
}

/** Corner points of the curve: each climb or cool ends a line, each hold is a flat line after it. */
export function curvePoints(schedule: FiringSchedule): CurvePoint[] {
  const start = schedule.segments[0]?.fromC ?? ROOM_C
  const points: CurvePoint[] = [{ hours: 0, temperatureC: start }]
  let hours = 0
  for (const segment of schedule.segments) {
    hours += Math.abs(segment.toC - segment.fromC) / segment.rateCPerHour
    points.push({ hours, temperatureC: segment.toC })
    if (segment.holdMinutes > 0) {
      hours += segment.holdMinutes / 60
      points.push({ hours, temperatureC: segment.toC })
    }
  }
  return points
}

/** Where each zone starts and ends in hours; neighbouring segments of one zone make one span. */
export function zoneSpans(schedule: FiringSchedule): ZoneSpan[] {
  const spans: ZoneSpan[] = []
  let hours = 0
  for (const segment of schedule.segments) {
    const fromHours = hours
    hours += Math.abs(segment.toC - segment.fromC) / segment.rateCPerHour + segment.holdMinutes / 60
    const last = spans.at(-1)
    if (last && last.zone === segment.zone) last.toHours = hours
    else spans.push({ zone: segment.zone, fromHours, toHours: hours })
  }
  return spans
}

/** The zone's name on the chart; the final climb is 100 °C, which is 180 °F of difference. */
export function zoneName(zone: SegmentZone, scale: TemperatureScale): string {
  if (zone === 'final-100' && scale === 'F') return `Final ${rateCToF(100)} °F`
  return zoneLabel(zone)
}
