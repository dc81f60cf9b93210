// Dates on the studio pages are the studio's local time, whoever looks: a studio in Portland posting
// from a laptop set to another zone still means 6 pm in Portland.
import { TZDate, tz } from '@date-fns/tz'
import { addDays, endOfMonth, endOfWeek, format, startOfMonth, startOfWeek } from 'date-fns'

const LOCAL_INPUT = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/

/** An instant as a datetime-local input's value ("2026-05-08T18:00") in the zone. */
export function isoToZonedInput(iso: string, zone: string): string {
  return format(new TZDate(iso, zone), "yyyy-MM-dd'T'HH:mm")
}

/** A datetime-local value read as wall-clock time in the zone, as an ISO instant; null when incomplete. */
export function zonedInputToIso(local: string, zone: string): string | null {
  const match = LOCAL_INPUT.exec(local)
  if (!match) return null
  const [, y, mo, d, h, mi] = match.map(Number)
  return new Date(new TZDate(y, mo - 1, d, h, mi, zone).getTime()).toISOString()
}

/** The calendar day of an instant in the zone, as "yyyy-MM-dd" (the key firings are grouped by). */
export function dayKey(iso: string | Date, zone: string): string {
  return format(new TZDate(typeof iso === 'string' ? Date.parse(iso) : iso.getTime(), zone), 'yyyy-MM-dd')
}

export interface MonthGrid {
  /** "2026-05": the month shown. */
  month: string
  title: string
  /** Whole weeks, Sunday first, covering the month. */
  weeks: { key: string; day: number; inMonth: boolean }[][]
  /** The instants the grid starts and ends at, for asking the API. */
  from: string
  to: string
}

/** The weeks of a month in the zone; `month` is "yyyy-MM". */
export function monthGrid(month: string, zone: string): MonthGrid {
  const [y, m] = month.split('-').map(Number)
  const inZone = { in: tz(zone) }
  const first = startOfMonth(new TZDate(y, m - 1, 1, zone), inZone)
  const gridStart = startOfWeek(first, inZone)
  const gridEnd = endOfWeek(endOfMonth(first, inZone), inZone)
  const weeks: MonthGrid['weeks'] = []
  for (let day = gridStart; day <= gridEnd; day = addDays(day, 1, inZone)) {
    if (day.getDay() === 0 || weeks.length === 0) weeks.push([])
    weeks[weeks.length - 1].push({ key: format(day, 'yyyy-MM-dd'), day: day.getDate(), inMonth: day.getMonth() === m - 1 })
  }
  return {
    month,
    title: format(first, 'MMMM yyyy'),
    weeks,
    from: new Date(gridStart.getTime()).toISOString(),
    to: new Date(gridEnd.getTime()).toISOString(),
  }
}

/** "yyyy-MM" of an instant in the zone. */
export function monthOf(instant: Date, zone: string): string {
  return format(new TZDate(instant.getTime(), zone), 'yyyy-MM')
}

export function shiftMonth(month: string, by: number): string {
  const [y, m] = month.split('-').map(Number)
  const index = y * 12 + (m - 1) + by
  return `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`
}

/** The weekday of an instant in the zone, e.g. "Friday". */
export function weekdayIn(iso: string, zone: string): string {
  return format(new TZDate(iso, zone), 'EEEE')
}

/** The zone's short name at an instant, e.g. "PDT". */
export function zoneAbbreviation(zone: string, at: Date = new Date()): string {
  const part = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'short' })
    .formatToParts(at)
    .find((p) => p.type === 'timeZoneName')
  return part?.value ?? zone
}
