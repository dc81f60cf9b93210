// The logged curve as the kiln tech builds it: readings typed in one by one on a phone during the
// firing, or a controller's CSV export mapped column by column, previewed, then taken in.
import { useMemo, useState } from 'react'
import {
  TIME_FORMATS,
  guessMapping,
  mapReadings,
  parseCsv,
  thinReadings,
  type CsvMapping,
  type CsvTable,
  type Reading,
} from '../../../../shared/firing/readings'
import { MAX_READINGS } from '../../../../shared/schemas/pickup'
import { formatDateTime } from '../../../../shared/dates'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, Select, TextInput } from '../../../components/ui/Field'
import { fToC } from '../../../../shared/firing/units'
import { formatTemperature, scaleOf, type UnitSystem } from '../../../lib/units'
import { isoToZonedInput, zonedInputToIso } from '../zonedTime'

const TIME_FORMAT_WORDS: Record<(typeof TIME_FORMATS)[number], string> = {
  clock: 'Clock time (21:45), from the day it started',
  'elapsed-minutes': 'Minutes since the start',
  'elapsed-hours': 'Hours since the start',
  'elapsed-hms': 'h:mm since the start',
  'date-time': 'Date and time',
}

interface ReadingsEditorProps {
  readings: Reading[]
  onChange: (readings: Reading[]) => void
  zone: string
  units: UnitSystem
  /** The instant the curve starts from for elapsed times: started, else loaded. */
  startIso: string | null
  /** Field messages from the server for the readings. */
  error?: string
}

export function ReadingsEditor({ readings, onChange, zone, units, startIso, error }: ReadingsEditorProps) {
  const scale = scaleOf(units)
  const [when, setWhen] = useState('')
  const [temperature, setTemperature] = useState('')
  const [typedError, setTypedError] = useState<string | null>(null)
  const sorted = useMemo(() => [...readings].sort((a, b) => Date.parse(a.at) - Date.parse(b.at)), [readings])

  const addTyped = () => {
    const at = when ? zonedInputToIso(when, zone) : new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString()
    const value = Number(temperature.replace(',', '.'))
    if (!at) return setTypedError('Enter the time as a full date and time.')
    if (temperature.trim() === '' || !Number.isFinite(value))
      return setTypedError(`Enter the temperature in ${scale === 'F' ? '°F' : '°C'}.`)
    setTypedError(null)
    onChange([...readings, { at, tempC: Math.round((scale === 'F' ? fToC(value) : value) * 10) / 10 }])
    setTemperature('')
    setWhen('')
  }

  return (
    <div className="space-y-4" data-testid="readings-editor">
      <div className="grid gap-3 sm:grid-cols-[1fr_10rem_auto] sm:items-end">
        <Field label="Reading time" hint="Empty: now.">
          {(a11y) => <TextInput {...a11y} type="datetime-local" value={when} onChange={(e) => setWhen(e.target.value)} />}
        </Field>
        <Field label={`Temperature (${scale === 'F' ? '°F' : '°C'})`}>
          {(a11y) => (
            <TextInput
              {...a11y}
              inputMode="decimal"
              value={temperature}
              onChange={(e) => setTemperature(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  e.preventDefault()
                  addTyped()
                }
              }}
            />
          )}
        </Field>
        <Button variant="secondary" size="sm" onClick={addTyped}>
          Add the reading
        </Button>
      </div>
      {typedError && <p className="text-sm font-medium text-danger-700">{typedError}</p>}
      {error && <Alert tone="danger">{error}</Alert>}

      <p className="text-sm text-slip-700" data-testid="reading-count">
        {sorted.length === 0 ? 'No readings yet.' : `${sorted.length} ${sorted.length === 1 ? 'reading' : 'readings'}.`}
        {sorted.length > 0 && (
          <button type="button" className="ml-2 text-xs font-semibold text-clay-700 hover:underline" onClick={() => onChange([])}>
            Clear them all
          </button>
        )}
      </p>
      {sorted.length > 0 && sorted.length <= 40 && (
        <ul className="divide-y divide-slip-100 text-sm" aria-label="Readings">
          {sorted.map((reading, index) => (
            <li key={`${reading.at}-${index}`} className="flex items-center justify-between gap-2 py-1">
              <span className="tabular-nums">
                {formatDateTime(reading.at, zone)} · {formatTemperature(reading.tempC, scale)}
              </span>
              <button
                type="button"
                className="text-xs font-semibold text-clay-700 hover:underline"
                onClick={() => onChange(sorted.filter((_, i) => i !== index))}
                aria-label={`Remove the reading at ${formatDateTime(reading.at, zone)}`}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}

      <CsvImport zone={zone} units={units} startIso={startIso} onTake={(taken) => onChange(thinReadings(taken, MAX_READINGS))} />
    </div>
  )
}

function CsvImport({
  zone,
  units,
  startIso,
  onTake,
}: {
  zone: string
  units: UnitSystem
  startIso: string | null
  onTake: (readings: Reading[]) => void
}) {
  const scale = scaleOf(units)
  const [table, setTable] = useState<CsvTable | null>(null)
  const [mapping, setMapping] = useState<CsvMapping | null>(null)
  const [fileError, setFileError] = useState<string | null>(null)

  const context = useMemo(() => {
    const start = startIso ? Date.parse(startIso) : NaN
    if (!Number.isFinite(start)) return null
    const day = isoToZonedInput(startIso!, zone).slice(0, 10)
    return { startMs: start, midnightMs: Date.parse(zonedInputToIso(`${day}T00:00`, zone)!) }
  }, [startIso, zone])
  const mapped = useMemo(() => (table && mapping && context ? mapReadings(table, mapping, context) : null), [table, mapping, context])

  const onFile = async (file: File | undefined) => {
    setFileError(null)
    if (!file) return
    if (file.size > 5_000_000) return setFileError('That file is over 5 MB; export the firing alone.')
    const parsed = parseCsv(await file.text())
    if (parsed.rows.length === 0) return setFileError('No rows found in that file.')
    setTable(parsed)
    setMapping(guessMapping(parsed))
  }

  const columns = table ? Math.max(table.header?.length ?? 0, ...table.rows.slice(0, 20).map((r) => r.length)) : 0
  const columnName = (i: number) => table?.header?.[i] || `Column ${i + 1}`
  const set = (patch: Partial<CsvMapping>) => setMapping((m) => (m ? { ...m, ...patch } : m))

  return (
    <details className="rounded-control border border-slip-200 p-3" data-testid="csv-import">
      <summary className="cursor-pointer text-sm font-semibold text-slip-800">Take readings from a controller’s CSV export</summary>
      <div className="mt-3 space-y-3">
        {!context && <Alert tone="info">Enter when the firing started (or was loaded) first: elapsed times count from it.</Alert>}
        <Field label="CSV file" hint="Any controller’s export: you say which column is which below.">
          {(a11y) => (
            <input {...a11y} type="file" accept=".csv,.txt,text/csv" className="text-sm" onChange={(e) => onFile(e.target.files?.[0])} />
          )}
        </Field>
        {fileError && <Alert tone="danger">{fileError}</Alert>}
        {table && mapping && (
          <>
            <div className="grid gap-3 sm:grid-cols-2">
              <Field label="Time column">
                {(a11y) => (
                  <Select {...a11y} value={mapping.timeColumn} onChange={(e) => set({ timeColumn: Number(e.target.value) })}>
                    {Array.from({ length: columns }, (_, i) => (
                      <option key={i} value={i}>
                        {columnName(i)}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Times are">
                {(a11y) => (
                  <Select
                    {...a11y}
                    value={mapping.timeFormat}
                    onChange={(e) => set({ timeFormat: e.target.value as CsvMapping['timeFormat'] })}
                  >
                    {TIME_FORMATS.map((format) => (
                      <option key={format} value={format}>
                        {TIME_FORMAT_WORDS[format]}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Temperature column">
                {(a11y) => (
                  <Select {...a11y} value={mapping.tempColumn} onChange={(e) => set({ tempColumn: Number(e.target.value) })}>
                    {Array.from({ length: columns }, (_, i) => (
                      <option key={i} value={i}>
                        {columnName(i)}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Temperature unit">
                {(a11y) => (
                  <Select
                    {...a11y}
                    value={mapping.unit === 'column' ? `column-${mapping.unitColumn ?? 0}` : mapping.unit}
                    onChange={(e) => {
                      const v = e.target.value
                      if (v === 'C' || v === 'F') set({ unit: v })
                      else set({ unit: 'column', unitColumn: Number(v.slice('column-'.length)) })
                    }}
                  >
                    <option value="C">°C</option>
                    <option value="F">°F</option>
                    {Array.from({ length: columns }, (_, i) => (
                      <option key={i} value={`column-${i}`}>
                        Read from {columnName(i)}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
            </div>
            {mapped && (
              <div className="space-y-2">
                <table className="w-full text-left text-xs" data-testid="csv-preview">
                  <caption className="mb-1 text-left text-sm font-medium text-slip-800">
                    Preview: the first rows as they will be kept
                  </caption>
                  <thead className="text-slip-500">
                    <tr>
                      <th scope="col" className="py-1 pr-3 font-medium">
                        Time
                      </th>
                      <th scope="col" className="py-1 font-medium">
                        Temperature
                      </th>
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-slip-100">
                    {mapped.readings.slice(0, 8).map((r, i) => (
                      <tr key={i}>
                        <td className="py-1 pr-3 tabular-nums">{formatDateTime(r.at, zone)}</td>
                        <td className="py-1 tabular-nums">{formatTemperature(r.tempC, scale)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                <p className="text-sm text-slip-700" data-testid="csv-summary">
                  {mapped.readings.length} readings
                  {mapped.skipped.length > 0 &&
                    `; ${mapped.skipped.length} rows left out (row ${mapped.skipped[0].row}: ${mapped.skipped[0].reason})`}
                  {mapped.readings.length > MAX_READINGS && `; thinned to ${MAX_READINGS}, keeping the peak`}.
                </p>
                <Button size="sm" disabled={mapped.readings.length === 0} onClick={() => onTake(mapped.readings)}>
                  Use these {mapped.readings.length} readings
                </Button>
              </div>
            )}
          </>
        )}
      </div>
    </details>
  )
}
