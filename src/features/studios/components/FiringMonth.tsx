import { formatDateTime } from '../../../../shared/dates'
import type { FiringRecord } from '../api/types'
import { dayKey, type MonthGrid } from '../zonedTime'
import { FiringStatusBadge } from './FiringStatusBadge'

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat']

const time = (iso: string, zone: string) =>
  new Intl.DateTimeFormat('en-US', { timeZone: zone, hour: 'numeric', minute: '2-digit' }).format(new Date(iso))

interface FiringMonthProps {
  grid: MonthGrid
  firings: FiringRecord[]
  zone: string
  kilnName: (kilnId: string) => string
  onOpen: (firing: FiringRecord) => void
  today: string
}

/** A month of firings by the day they fire in the studio's zone; on a phone, the days that have any. */
export function FiringMonth({ grid, firings, zone, kilnName, onOpen, today }: FiringMonthProps) {
  const byDay = new Map<string, FiringRecord[]>()
  for (const firing of firings) {
    const key = dayKey(firing.firingDate, zone)
    byDay.set(key, [...(byDay.get(key) ?? []), firing])
  }
  const chip = (firing: FiringRecord) => (
    <button
      key={firing.id}
      type="button"
      onClick={() => onOpen(firing)}
      data-testid="calendar-firing"
      className={`block w-full rounded-control border px-1.5 py-1 text-left text-xs hover:border-clay-400 ${firing.status === 'cancelled' ? 'border-slip-200 bg-slip-100 text-slip-500 line-through' : 'border-clay-200 bg-clay-50 text-clay-900'}`}
    >
      {/* The name read aloud is the text seen, with the cone and the full date spelled out for a screen reader. */}
      <span className="font-semibold">{time(firing.firingDate, zone)}</span> <span aria-hidden>^</span>
      <span className="sr-only">cone </span>
      {firing.cone} {firing.kind}
      <span className="block truncate text-slip-600">{kilnName(firing.kilnId)}</span>
      <span className="sr-only">, {formatDateTime(firing.firingDate, zone)}</span>
    </button>
  )
  const daysWithFirings = grid.weeks.flat().filter((d) => d.inMonth && byDay.has(d.key))

  return (
    <>
      <div className="hidden overflow-hidden rounded-card border border-slip-200 bg-white sm:block">
        <table className="w-full table-fixed border-collapse text-sm">
          <caption className="sr-only">Firings in {grid.title}</caption>
          <thead>
            <tr>
              {WEEKDAYS.map((day) => (
                <th
                  key={day}
                  scope="col"
                  className="border-b border-slip-200 bg-slip-50 py-2 text-xs font-semibold uppercase tracking-wide text-slip-600"
                >
                  {day}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {grid.weeks.map((week) => (
              <tr key={week[0].key}>
                {week.map((day) => (
                  <td
                    key={day.key}
                    className={`h-28 border border-slip-100 p-1 align-top ${day.inMonth ? '' : 'bg-slip-50 text-slip-500'}`}
                  >
                    <span
                      className={`mb-1 inline-flex size-6 items-center justify-center rounded-full text-xs font-semibold ${day.key === today ? 'bg-clay-600 text-white' : ''}`}
                    >
                      {day.day}
                    </span>
                    <div className="space-y-1">{(byDay.get(day.key) ?? []).map(chip)}</div>
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="space-y-3 sm:hidden">
        {daysWithFirings.length === 0 ? (
          <p className="rounded-card border border-dashed border-slip-300 bg-slip-50 px-4 py-6 text-center text-sm text-slip-600">
            No firings in {grid.title}.
          </p>
        ) : (
          daysWithFirings.map((day) => (
            <div key={day.key}>
              <p className="mb-1 text-sm font-semibold">
                {new Intl.DateTimeFormat('en-US', { timeZone: zone, weekday: 'long', month: 'short', day: 'numeric' }).format(
                  new Date(byDay.get(day.key)![0].firingDate),
                )}
              </p>
              <div className="space-y-1">
                {byDay.get(day.key)!.map((firing) => (
                  <div key={firing.id} className="flex items-center gap-2">
                    <div className="flex-1">{chip(firing)}</div>
                    <FiringStatusBadge status={firing.status} />
                  </div>
                ))}
              </div>
            </div>
          ))
        )}
      </div>
    </>
  )
}
