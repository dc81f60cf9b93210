// Temperature readings from a controller's export. Every controller writes its own CSV (comma,
// semicolon or tab; a header or none; clock times, elapsed minutes, elapsed h:mm or full dates; °C or
// °F, sometimes in a column of its own), so the studio maps the columns once, sees a preview, and the
// readings come out in one form: an instant and a temperature in °C.

import { fToC } from './units'

export interface Reading {
  /** ISO 8601 instant. */
  at: string
  tempC: number
}

export interface CsvTable {
  delimiter: ',' | ';' | '\t'
  /** The first row's cells when it names the columns; null when every row is data. */
  header: string[] | null
  rows: string[][]
}

export const TIME_FORMATS = ['clock', 'elapsed-minutes', 'elapsed-hours', 'elapsed-hms', 'date-time'] as const
/**
 * clock: "21:45" or "9:45 PM" on the day the firing started, rolling past midnight; elapsed-minutes
 * and elapsed-hours: numbers from the start; elapsed-hms: "h:mm" or "h:mm:ss" from the start;
 * date-time: a full date and time ("2026-03-04 21:45", ISO 8601).
 */
export type TimeFormat = (typeof TIME_FORMATS)[number]

export interface CsvMapping {
  timeColumn: number
  timeFormat: TimeFormat
  tempColumn: number
  /** The unit of the temperature column; 'column' reads it per row from unitColumn. */
  unit: 'C' | 'F' | 'column'
  unitColumn?: number | null
}

export interface MapContext {
  /** Epoch ms of minute 0 for elapsed times (the firing's start). */
  startMs: number
  /** Epoch ms of local midnight on the day the firing started, for clock times. */
  midnightMs: number
}

export interface MappedReadings {
  readings: Reading[]
  /** Rows left out, 1-based as a spreadsheet counts them (the header is row 1). */
  skipped: { row: number; reason: string }[]
}

const MAX_ROWS = 20_000

function splitLine(line: string, delimiter: string): string[] {
  const cells: string[] = []
  let cell = ''
  let quoted = false
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"'
        i++
      } else if (ch === '"') quoted = false
      else cell += ch
    } else if (ch === '"' && cell.trim() === '') {
      quoted = true
      cell = ''
    } else if (ch === delimiter) {
      cells.push(cell.trim())
      cell = ''
    } else cell += ch
  }
  cells.push(cell.trim())
  return cells
}

const NUMBER = /^-?\d+(?:[.,]\d+)?$/

/** A cell as a number: "1222", "1222.5", and "1222,5" when the file uses a comma for decimals. */
export function cellNumber(cell: string): number | null {
  const trimmed = cell.trim().replace(/\s*°?\s*[CF]$/i, '')
  if (!NUMBER.test(trimmed)) return null
  return Number(trimmed.replace(',', '.'))
}

/** Reads a CSV export: finds the delimiter, splits quoted cells, and tells a header row from data. */
export function parseCsv(text: string): CsvTable {
  const lines = text
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\n|\r/)
    .filter((line) => line.trim() !== '')
    .slice(0, MAX_ROWS + 1)
  const sample = lines.slice(0, 20)
  const count = (d: string) => sample.reduce((sum, line) => sum + line.split(d).length - 1, 0)
  // A semicolon file often uses commas for decimals, so commas count only when they are the most common.
  const delimiter = (['\t', ';', ','] as const).reduce((best, d) => (count(d) > count(best) ? d : best), ',' as CsvTable['delimiter'])
  const rows = lines.map((line) => splitLine(line, delimiter))
  const first = rows[0] ?? []
  // A header row has a cell with letters where the rows below hold numbers or times.
  const header = rows.length > 1 && first.some((cell) => /[a-z]/i.test(cell) && cellNumber(cell) === null) ? first : null
  return { delimiter, header, rows: header ? rows.slice(1) : rows }
}

/** A first guess at the columns, from the header's words and the cells' shapes; the studio can change it. */
export function guessMapping(table: CsvTable): CsvMapping {
  const names = (table.header ?? []).map((name) => name.toLowerCase())
  const sample = table.rows.slice(0, 10)
  const columns = Math.max(names.length, ...sample.map((row) => row.length), 1)
  const find = (test: (name: string) => boolean) => names.findIndex(test)
  let timeColumn = find((n) => /time|date|elapsed|minute|hour|clock/.test(n))
  let tempColumn = find((n) => /temp|°|deg|tc|thermo|reading/.test(n) && !/set|target|unit/.test(n))
  const unitColumn = find((n) => /^unit|scale/.test(n))
  const numericColumn = (column: number) => sample.length > 0 && sample.every((row) => cellNumber(row[column] ?? '') !== null)
  if (timeColumn < 0) timeColumn = 0
  if (tempColumn < 0 || tempColumn === timeColumn) {
    tempColumn = Array.from({ length: columns }, (_, i) => i).find((i) => i !== timeColumn && numericColumn(i)) ?? Math.min(1, columns - 1)
  }
  const timeCells = sample.map((row) => row[timeColumn] ?? '')
  let timeFormat: TimeFormat = 'elapsed-minutes'
  if (timeCells.some((cell) => /\d{4}-\d{2}-\d{2}|\d{1,2}\/\d{1,2}\/\d{2,4}/.test(cell))) timeFormat = 'date-time'
  else if (timeCells.some((cell) => /am|pm/i.test(cell))) timeFormat = 'clock'
  else if (timeCells.some((cell) => /^\d{1,3}:\d{2}/.test(cell))) {
    // h:mm from the start begins near 0:00; a clock reading rarely does.
    timeFormat = /^0{1,2}:0\d/.test(timeCells[0] ?? '') ? 'elapsed-hms' : 'clock'
  } else if (/hour|hr/.test(names[timeColumn] ?? '')) timeFormat = 'elapsed-hours'
  const header = `${names[tempColumn] ?? ''}`
  const tempCells = sample.map((row) => row[tempColumn] ?? '')
  const unit: CsvMapping['unit'] =
    unitColumn >= 0 ? 'column' : /°?f\b|fahrenheit/.test(header) || tempCells.some((cell) => /°?\s*F$/i.test(cell)) ? 'F' : 'C'
  return { timeColumn, timeFormat, tempColumn, unit, unitColumn: unitColumn >= 0 ? unitColumn : null }
}

const CLOCK = /^(\d{1,2}):(\d{2})(?::(\d{2}))?\s*(am|pm)?$/i
const HMS = /^(\d{1,4}):(\d{2})(?::(\d{2}))?$/

function minutesOfClock(cell: string): number | null {
  const match = CLOCK.exec(cell.trim())
  if (!match) return null
  let hours = Number(match[1])
  const minutes = Number(match[2])
  const seconds = Number(match[3] ?? 0)
  const half = match[4]?.toLowerCase()
  if (half) {
    if (hours < 1 || hours > 12) return null
    hours = (hours % 12) + (half === 'pm' ? 12 : 0)
  }
  if (hours > 23 || minutes > 59 || seconds > 59) return null
  return hours * 60 + minutes + seconds / 60
}

/** The rows as readings under a mapping: each kept row gives an instant and °C; the rest say why not. */
export function mapReadings(table: CsvTable, mapping: CsvMapping, context: MapContext): MappedReadings {
  const readings: Reading[] = []
  const skipped: MappedReadings['skipped'] = []
  const firstRow = table.header ? 2 : 1
  let lastClock: number | null = null
  let dayOffset = 0
  table.rows.forEach((row, index) => {
    const rowNumber = firstRow + index
    const timeCell = row[mapping.timeColumn] ?? ''
    const tempCell = row[mapping.tempColumn] ?? ''
    const value = cellNumber(tempCell)
    if (value === null) {
      skipped.push({ row: rowNumber, reason: `“${tempCell}” is not a temperature.` })
      return
    }
    let unit: 'C' | 'F' = mapping.unit === 'F' ? 'F' : 'C'
    if (mapping.unit === 'column') {
      const unitCell = (row[mapping.unitColumn ?? -1] ?? '').trim().toUpperCase().replace('°', '')
      if (unitCell !== 'C' && unitCell !== 'F') {
        skipped.push({ row: rowNumber, reason: `“${unitCell}” is not °C or °F.` })
        return
      }
      unit = unitCell
    } else if (/°?\s*F$/i.test(tempCell.trim())) unit = 'F'
    else if (/°?\s*C$/i.test(tempCell.trim())) unit = 'C'
    const tempC = unit === 'F' ? fToC(value) : value

    let ms: number | null = null
    if (mapping.timeFormat === 'elapsed-minutes' || mapping.timeFormat === 'elapsed-hours') {
      const n = cellNumber(timeCell)
      if (n !== null && n >= 0) ms = context.startMs + n * (mapping.timeFormat === 'elapsed-hours' ? 3_600_000 : 60_000)
    } else if (mapping.timeFormat === 'elapsed-hms') {
      const match = HMS.exec(timeCell.trim())
      if (match) ms = context.startMs + (Number(match[1]) * 3600 + Number(match[2]) * 60 + Number(match[3] ?? 0)) * 1000
    } else if (mapping.timeFormat === 'clock') {
      const minutes = minutesOfClock(timeCell)
      if (minutes !== null) {
        // A clock reading earlier than the one before it has passed midnight.
        if (lastClock !== null && minutes < lastClock - 1) dayOffset++
        lastClock = minutes
        ms = context.midnightMs + (dayOffset * 24 * 60 + minutes) * 60_000
      }
    } else {
      const parsed = Date.parse(timeCell.trim().replace(/^(\d{4}-\d{2}-\d{2}) /, '$1T'))
      if (Number.isFinite(parsed)) ms = parsed
    }
    if (ms === null) {
      skipped.push({ row: rowNumber, reason: `“${timeCell}” is not a time in the chosen form.` })
      return
    }
    readings.push({ at: new Date(ms).toISOString(), tempC: Math.round(tempC * 10) / 10 })
  })
  return { readings, skipped }
}

/** Keeps at most `max` readings, evenly spread, always with the first, the hottest and the last. */
export function thinReadings(readings: Reading[], max: number): Reading[] {
  if (readings.length <= max) return readings
  let hottest = 0
  readings.forEach((r, i) => {
    if (r.tempC > readings[hottest].tempC) hottest = i
  })
  const step = (readings.length - 1) / (max - 2)
  const keep = new Set<number>([0, hottest, readings.length - 1])
  for (let i = 0; keep.size < max && i * step < readings.length; i++) keep.add(Math.round(i * step))
  return [...keep].sort((a, b) => a - b).map((i) => readings[i])
}
