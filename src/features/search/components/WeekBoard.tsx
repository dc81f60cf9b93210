import { Link } from 'react-router-dom'
import type { BoardStudio } from '../../../../shared/api/board'
import type { UnitSystem } from '../units'
import { formatDistance } from '../units'
import { weekEnd, weekGrid } from '../weeks'
import { FiringChip } from './FiringChip'

const monthDay = new Intl.DateTimeFormat(undefined, { month: 'short', day: 'numeric' })

interface WeekBoardProps {
  studios: BoardStudio[]
  units: UnitSystem
}

/**
 * The board laid out by week, for a potter who plans by date: weeks across by the day ware is due,
 * studios down in the board's order (nearest first when a place is given). The grid scrolls inside
 * its own frame on a narrow screen; the studio column stays put.
 */
export function WeekBoard({ studios, units }: WeekBoardProps) {
  const { weeks, rows } = weekGrid(studios)
  return (
    <div className="max-w-full overflow-x-auto rounded-card border border-slip-200 bg-white shadow-card" data-testid="week-board">
      <table className="min-w-full border-collapse text-left text-sm">
        <caption className="sr-only">Firings by the week ware is due, one row per studio</caption>
        <thead>
          <tr className="border-b border-slip-200 bg-slip-50">
            <th scope="col" className="sticky left-0 z-10 bg-slip-50 px-3 py-2 font-semibold text-slip-900">
              Studio
            </th>
            {weeks.map((week) => (
              <th key={week.key} scope="col" className="px-2 py-2 font-semibold whitespace-nowrap text-slip-900" data-testid="week-column">
                {monthDay.format(week.monday)}–{monthDay.format(weekEnd(week))}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map(({ studio: card, cells, later }) => (
            <tr key={card.studio.id} className="border-b border-slip-100 align-top last:border-0" data-testid="week-row">
              <th scope="row" className="sticky left-0 z-10 w-36 max-w-36 bg-white px-3 py-2 font-normal">
                <Link to={`/studios/${card.studio.id}`} className="font-semibold text-slip-900 hover:underline">
                  {card.studio.name}
                </Link>
                <span className="block text-xs text-slip-600">
                  {card.studio.city}
                  {card.distanceKm !== null && ` · ${formatDistance(card.distanceKm, units)}`}
                </span>
                {later > 0 && <span className="block text-xs text-slip-600">{later} later</span>}
              </th>
              {cells.map((firings, i) => (
                <td key={weeks[i].key} className="min-w-32 px-2 py-2">
                  <ul className="space-y-1.5">
                    {firings.map((firing) => (
                      <li key={firing.firingId}>
                        <FiringChip firing={firing} studioName={card.studio.name} compact />
                      </li>
                    ))}
                  </ul>
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}
