import type { BoardFiring, BoardStudio } from '../../../shared/api/board'

// The week view of the board: weeks across (Monday to Sunday where the potter is, by the day ware
// must be dropped off, which is the date a potter plans around), studios down in the board's order.

export interface BoardWeek {
  /** The Monday, as yyyy-mm-dd in the reader's zone. */
  key: string
  monday: Date
}

export interface WeekRow {
  studio: BoardStudio
  /** One list of firings per week, in the order of `weeks`. */
  cells: BoardFiring[][]
}

function mondayOf(instant: Date): Date {
  const monday = new Date(instant.getFullYear(), instant.getMonth(), instant.getDate())
  monday.setDate(monday.getDate() - ((monday.getDay() + 6) % 7))
  return monday
}

const dayKey = (d: Date) => `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`

/**
 * The weeks from the first drop-off to the last, at most `maxWeeks`; firings past the last week
 * shown are counted in `later` for the row to mention.
 */
export function weekGrid(studios: readonly BoardStudio[], maxWeeks = 8): { weeks: BoardWeek[]; rows: (WeekRow & { later: number })[] } {
  const all = studios.flatMap((s) => s.firings.map((f) => new Date(f.dropOffBy)))
  if (all.length === 0) return { weeks: [], rows: [] }
  const first = mondayOf(new Date(Math.min(...all.map((d) => d.getTime()))))
  const last = mondayOf(new Date(Math.max(...all.map((d) => d.getTime()))))
  const weeks: BoardWeek[] = []
  for (let monday = first; monday <= last && weeks.length < maxWeeks;) {
    weeks.push({ key: dayKey(monday), monday })
    // Seven calendar days on, not 7 × 24 h, so a change of clocks keeps Mondays at midnight.
    monday = new Date(monday.getFullYear(), monday.getMonth(), monday.getDate() + 7)
  }
  const column = new Map(weeks.map((w, i) => [w.key, i]))
  const rows = studios.map((studio) => {
    const cells: BoardFiring[][] = weeks.map(() => [])
    let later = 0
    for (const firing of studio.firings) {
      const at = column.get(dayKey(mondayOf(new Date(firing.dropOffBy))))
      if (at === undefined) later += 1
      else cells[at].push(firing)
    }
    return { studio, cells, later }
  })
  return { weeks, rows }
}

export const weekEnd = (week: BoardWeek) => new Date(week.monday.getFullYear(), week.monday.getMonth(), week.monday.getDate() + 6)
