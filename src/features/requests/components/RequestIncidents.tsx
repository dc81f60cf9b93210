import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import type { FiringIncidentJson, PotterIncidentRecord, RemedyJson } from '../../../../shared/api/incidents'
import type { RequestView } from '../../../../shared/api/requests'
import { formatDate, formatMoney } from '../../../../shared/dates'
import { Card } from '../../../components/ui/Card'
import { api } from '../../../lib/api'
import { requestKeys } from '../api/keys'

/** States in which the ware has been fired, so something may have gone wrong with it. */
const FIRED_STATES: readonly RequestView['state'][] = ['fired', 'ready', 'collected', 'disputed']

/** What the studio did for this ask's hurt pieces, in a line. */
function remedyWords(remedy: RemedyJson, timezone: string): string {
  if (remedy.kind === 'credit') return `Credit of ${formatMoney(remedy.amountCents ?? 0, remedy.currency ?? 'USD')}`
  const where = remedy.targetFiring
    ? ` in the ${remedy.targetFiring.kilnName} firing of ${formatDate(remedy.targetFiring.date, timezone)}`
    : ''
  return `Refire free: ${remedy.pieceTags.join(', ')}${where}`
}

/**
 * What went wrong in this firing as far as this ask goes: the incidents the viewer may see, and for a
 * potter the way to report one.
 */
export function RequestIncidents({ view }: { view: RequestView }) {
  const fired = FIRED_STATES.includes(view.state)
  const incidents = useQuery({
    queryKey: requestKeys.incidents.ofFiring(view.firing.id),
    queryFn: () => api<{ incidents: FiringIncidentJson[] }>(`/api/firings/${view.firing.id}/incidents`),
    enabled: fired,
  })
  if (!fired) return null
  const list = incidents.data?.incidents ?? []
  return (
    <Card>
      <h2 className="mb-2 text-lg font-semibold">What went wrong</h2>
      {list.length ? (
        <ul className="space-y-1 text-sm">
          {list.map((incident) => (
            <li key={incident.id}>
              <Link to={`/incidents/${incident.id}`} className="font-medium text-clay-700 hover:underline">
                {incident.kindLabel}
              </Link>{' '}
              reported {formatDate(incident.at, view.studio.timezone)}
              {incident.remedies.some((r) => r.requestId === view.id) && (
                <ul className="mt-1 list-disc pl-5 text-slip-800" aria-label="Made good by the studio">
                  {incident.remedies
                    .filter((r) => r.requestId === view.id)
                    .map((remedy) => (
                      <li key={remedy.id}>{remedyWords(remedy, view.studio.timezone)}</li>
                    ))}
                </ul>
              )}
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-slip-600">Nothing reported.</p>
      )}
      {view.viewer === 'potter' && (
        <p className="mt-3 text-sm">
          <Link to={`/firings/${view.firing.id}/incidents/new?request=${view.id}`} className="font-medium text-clay-700 hover:underline">
            Report what went wrong with your ware
          </Link>
        </p>
      )}
    </Card>
  )
}

/** The potter's record of incidents their ware caused, for a studio deciding on the ask. */
export function PotterIncidentRecordCard({ view }: { view: RequestView }) {
  const record = useQuery({
    queryKey: requestKeys.incidents.potterRecord(view.id),
    queryFn: () => api<PotterIncidentRecord>(`/api/requests/${view.id}/potter-record`),
    enabled: view.viewer === 'studio' && view.state === 'sent',
  })
  if (view.viewer !== 'studio' || view.state !== 'sent' || !record.data) return null
  const data = record.data
  return (
    <Card>
      <h2 className="mb-2 text-lg font-semibold">{view.potter.displayName}’s record</h2>
      {data.count === 0 ? (
        <p className="text-sm text-slip-700" data-testid="potter-record">
          No incidents caused by their ware on Conewright.
        </p>
      ) : (
        <div className="space-y-2 text-sm text-slip-800" data-testid="potter-record">
          <p>
            {data.count} incident{data.count === 1 ? '' : 's'} caused by their ware; {data.claimsPaid} damage claim
            {data.claimsPaid === 1 ? '' : 's'} paid, {data.claimsWaived} waived by the front desk.
          </p>
          <ul className="list-disc pl-5">
            {data.incidents.slice(0, 5).map((incident) => (
              <li key={`${incident.at}-${incident.kind}`}>
                {incident.kindLabel} at {incident.studioName}, {formatDate(incident.at, view.studio.timezone)}
              </li>
            ))}
          </ul>
        </div>
      )}
    </Card>
  )
}
