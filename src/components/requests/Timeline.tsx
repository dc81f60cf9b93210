import type { TimelineEntryJson as TimelineEntry } from '../../../shared/api/requests'
import { formatDateTime } from '../../../shared/dates'
import { REQUEST_STATE_LABELS } from '../../../shared/workflow/request-states'

const stateLabel = (state: TimelineEntry['to']) => REQUEST_STATE_LABELS[state]

/** Every change of a request: who, when, from what to what, and why. Read by either side and by the desk. */
export function Timeline({ entries, zone }: { entries: TimelineEntry[]; zone: string }) {
  if (entries.length === 0) return <p className="text-sm text-slip-600">Nothing has happened yet.</p>
  return (
    <ol className="relative space-y-4 border-l-2 border-slip-200 pl-5" data-testid="timeline">
      {entries.map((entry, index) => (
        <li key={`${entry.at}-${index}`} className="relative">
          <span className="absolute -left-[1.72rem] top-1 size-3 rounded-full border-2 border-white bg-clay-500" aria-hidden />
          <p className="text-sm text-slip-900">
            {entry.from === entry.to && entry.reason ? (
              // A step within a state (loaded, firing, results posted): the step is the news.
              <>
                <strong className="font-semibold">{entry.reason}</strong> <span className="text-slip-500">· {stateLabel(entry.to)}</span>
              </>
            ) : entry.from ? (
              <>
                {stateLabel(entry.from)} <span aria-label="to">→</span> <strong className="font-semibold">{stateLabel(entry.to)}</strong>
              </>
            ) : (
              <strong className="font-semibold">{stateLabel(entry.to)}</strong>
            )}
          </p>
          <p className="text-xs text-slip-600">
            {entry.by} · <time dateTime={entry.at}>{formatDateTime(entry.at, zone)}</time>
          </p>
          {entry.reason && entry.from !== entry.to && <p className="mt-0.5 text-sm text-slip-700">“{entry.reason}”</p>}
        </li>
      ))}
    </ol>
  )
}
