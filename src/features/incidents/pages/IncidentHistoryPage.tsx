import { Link, useParams } from 'react-router-dom'
import { formatDate } from '../../../../shared/dates'
import { formatCone } from '../../../../shared/firing/cones'
import { Alert } from '../../../components/ui/Alert'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { useStudioIncidents } from '../api/incidents'

/** A studio's incidents over time, counted by kiln, firing kind and phase, and listed one by one. */
export function IncidentHistoryPage() {
  const { id = '' } = useParams()
  const history = useStudioIncidents(id)
  if (history.isPending) return <Spinner label="Loading the incidents" />
  if (history.isError) return <Alert tone="danger">{history.error.message}</Alert>
  const { rows, incidents, timezone } = history.data
  return (
    <>
      <PageHeader
        title="Incidents"
        lead="What went wrong in your firings, by kiln, kind of firing and the phase it most likely happened in."
      />
      {rows.length === 0 ? (
        <EmptyState title="No incidents reported">Incidents reported on your firings are counted here.</EmptyState>
      ) : (
        <div className="space-y-5">
          <Card>
            <h2 className="mb-3 text-lg font-semibold text-slip-900">By kiln, firing and phase</h2>
            <Table caption="Incidents by kiln, firing and phase">
              <thead>
                <tr>
                  <Th>Kiln</Th>
                  <Th>Firing</Th>
                  <Th>Phase</Th>
                  <Th>Count</Th>
                  <Th>Last</Th>
                </tr>
              </thead>
              <tbody>
                {rows.map((row) => (
                  <tr key={`${row.kilnId}-${row.firingKind}-${row.cone}-${row.atmosphere}-${row.phase}`}>
                    <Td>{row.kilnName}</Td>
                    <Td>
                      {formatCone(row.cone)} {row.atmosphere} {row.firingKind}
                    </Td>
                    <Td>{row.phaseLabel}</Td>
                    <Td>{row.count}</Td>
                    <Td>{formatDate(row.last, timezone)}</Td>
                  </tr>
                ))}
              </tbody>
            </Table>
          </Card>
          <Card>
            <h2 className="mb-3 text-lg font-semibold text-slip-900">One by one</h2>
            <ul className="space-y-2 text-sm">
              {incidents.map((incident) => (
                <li key={incident.id}>
                  <Link to={`/incidents/${incident.id}`} className="font-medium text-clay-700 hover:underline">
                    {incident.kindLabel}
                  </Link>{' '}
                  in {incident.kilnName}, firing of {formatDate(incident.firingDate, timezone)}
                  {incident.pieceTags.length > 0 && <span className="font-mono"> ({incident.pieceTags.join(', ')})</span>}
                </li>
              ))}
            </ul>
          </Card>
        </div>
      )}
    </>
  )
}
