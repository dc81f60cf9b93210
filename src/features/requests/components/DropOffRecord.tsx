import { useMutationState } from '@tanstack/react-query'
import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { Alert } from '../../../components/ui/Alert'
import { Table, Td, Th } from '../../../components/ui/Table'
import { FindingsList, pieceName, VerdictLine } from '../../../components/ware/CheckResults'
import { formatLength, type UnitSystem } from '../../../lib/units'
import { checkInMutationKey } from '../api/pickup'
import type { CheckInOutcome, CheckInRecord, MeasuredSize, RequestView } from '../api/types'
import { priceChange } from '../pickupWords'

function measuredInWords(size: MeasuredSize, round: boolean | undefined, units: UnitSystem) {
  const tall = `${formatLength(size.heightMm, units)} tall`
  return round
    ? `${formatLength(size.widthMm, units)} across × ${tall}`
    : `${formatLength(size.widthMm, units)} × ${formatLength(size.depthMm, units)} × ${tall}`
}

/** The server's check of the ware as it came in, shown to the studio right after checking it in. */
function CheckInFindings({ view }: { view: RequestView }) {
  const outcomes = useMutationState({
    filters: { mutationKey: checkInMutationKey(view.id), status: 'success' },
    select: (m) => m.state.data as CheckInOutcome | undefined,
  })
  const outcome = outcomes.at(-1)
  if (!outcome || outcome.refused || !outcome.verdict) return null
  return (
    <div className="space-y-3 rounded-control border border-slip-200 bg-slip-50 p-3" data-testid="check-in-findings">
      <h3 className="text-sm font-semibold">The check of the ware as it came in</h3>
      <VerdictLine verdict={outcome.verdict} testId="check-in-verdict" />
      <FindingsList findings={outcome.findings} pieces={view.pieces} linkToRows={false} />
      {outcome.verdict === 'block' && (
        <p className="text-sm text-danger-700">
          Something here is not safe to fire. Talk to the potter, or call its place off with a reason.
        </p>
      )}
    </div>
  )
}

/** What changed in price at check-in, and whether it waits for the potter. */
export function PriceChangeNote({ view, currency }: { view: RequestView; currency: string }) {
  const change = priceChange(view)
  if (!change) return null
  const money = (cents: number) => formatMoney(cents, currency)
  const higher = change.afterCents > change.beforeCents
  const mine = view.viewer === 'potter'
  return (
    <Alert
      tone={change.waiting || change.declined ? 'warning' : 'info'}
      title={higher ? 'The measured ware costs more' : 'The measured ware costs less'}
    >
      <p data-testid="price-change">
        {money(change.beforeCents)} → <strong>{money(change.afterCents)}</strong>
      </p>
      <p className="mt-1">
        {change.waiting
          ? mine
            ? 'Confirm the new price before the firing; if it looks wrong, message the studio.'
            : 'The potter has to confirm the higher price before the firing. Until then the first price stands.'
          : change.declined
            ? mine
              ? 'You turned the new price down: your ask is withdrawn and what you paid is refunded.'
              : 'The potter turned the new price down: their ask is withdrawn; keep the ware out of the load.'
            : higher
              ? 'The potter confirmed the new price.'
              : 'The lower price applies at once.'}
      </p>
    </Alert>
  )
}

/** The check-in as recorded: counts against the declaration, measured sizes, condition, photos. */
export function DropOffRecord({ view, checkIn, units }: { view: RequestView; checkIn: CheckInRecord; units: UnitSystem }) {
  const zone = view.studio.timezone
  const currency = view.quote?.currency ?? 'USD'
  if (checkIn.refused) {
    return (
      <div className="space-y-3" data-testid="drop-off-record" data-refused="true">
        <Alert tone="danger" title="Refused at the door">
          <p>“{checkIn.refusedReason}”</p>
          <p className="mt-1 text-xs">{formatDateTime(checkIn.at, zone)}</p>
        </Alert>
        {checkIn.conditionNotes && <p className="whitespace-pre-line text-sm text-slip-800">{checkIn.conditionNotes}</p>}
        <PhotoGallery photos={view.photos} kinds={['refusal']} />
      </div>
    )
  }
  return (
    <div className="space-y-4" data-testid="drop-off-record" data-refused="false">
      <p className="text-sm text-slip-600">Taken in {formatDateTime(checkIn.at, zone)}.</p>
      <Table caption="Pieces received">
        <thead>
          <tr>
            <Th>Piece</Th>
            <Th className="text-right">Declared</Th>
            <Th className="text-right">Received</Th>
            <Th>Measured</Th>
          </tr>
        </thead>
        <tbody className="divide-y divide-slip-100">
          {checkIn.receivedPieces.map((row) => (
            <tr key={row.pieceIndex} data-testid="received-piece">
              <Td className="font-medium">{pieceName(view.pieces, row.pieceIndex)}</Td>
              <Td className="text-right tabular-nums">{row.declared}</Td>
              <Td className={`text-right tabular-nums ${row.received < row.declared ? 'font-semibold text-ember-700' : ''}`}>
                {row.received}
              </Td>
              <Td>{row.measured ? measuredInWords(row.measured, view.pieces[row.pieceIndex]?.round, units) : 'As declared'}</Td>
            </tr>
          ))}
        </tbody>
      </Table>
      <div>
        <h3 className="text-sm font-semibold">Condition at drop-off</h3>
        <p className="mt-1 whitespace-pre-line text-sm text-slip-800" data-testid="condition-notes">
          {checkIn.conditionNotes || 'No damage noted.'}
        </p>
      </div>
      <PriceChangeNote view={view} currency={currency} />
      {view.viewer !== 'potter' && <CheckInFindings view={view} />}
      <PhotoGallery photos={view.photos} kinds={['check-in']} empty="No photos were taken at drop-off." />
    </div>
  )
}
