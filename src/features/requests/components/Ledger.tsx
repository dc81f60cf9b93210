import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { Table, Td, Th } from '../../../components/ui/Table'
import type { LedgerEntry } from '../api/types'
import { shortStripeId } from '../requestWords'

const KIND_WORDS: Record<string, string> = {
  deposit: 'Deposit received',
  balance: 'Balance received',
  counter: 'Paid at the studio',
  refund: 'Refunded',
}

const whatOf = (entry: LedgerEntry) => KIND_WORDS[entry.kind] ?? (entry.direction === 'in' ? 'Received' : 'Paid out')

function StripeIds({ entry }: { entry: LedgerEntry }) {
  const ids = [entry.stripePaymentIntentId, entry.stripeRefundId, entry.stripeSessionId].filter((id): id is string => Boolean(id))
  if (ids.length === 0) return <>—</>
  return (
    <span className="flex flex-col gap-0.5">
      {ids.map((id) => (
        <code key={id} title={id} className="text-xs text-slip-600">
          {shortStripeId(id)}
        </code>
      ))}
    </span>
  )
}

/** Money in and out for this request, as the payment provider recorded it. */
export function Ledger({ entries, zone }: { entries: LedgerEntry[]; zone: string }) {
  if (entries.length === 0)
    return (
      <p className="text-sm text-slip-600" data-testid="ledger-empty">
        No money has moved yet.
      </p>
    )
  return (
    <Table caption="Money in and out">
      <thead>
        <tr>
          <Th>When</Th>
          <Th>What</Th>
          <Th className="text-right">Amount</Th>
          <Th>Payment ids</Th>
        </tr>
      </thead>
      <tbody className="divide-y divide-slip-100">
        {entries.map((entry, index) => (
          <tr key={index} data-testid="ledger-line" data-direction={entry.direction} data-kind={entry.kind}>
            <Td className="whitespace-nowrap">{formatDateTime(entry.at, zone)}</Td>
            <Td>
              {whatOf(entry)}
              {entry.note && <span className="block text-xs text-slip-500">{entry.note}</span>}
            </Td>
            <Td
              className={`whitespace-nowrap text-right tabular-nums ${entry.direction === 'in' ? 'text-celadon-700' : 'text-danger-700'}`}
            >
              {entry.direction === 'in' ? '+' : '−'}
              {formatMoney(entry.amountCents, entry.currency)}
            </Td>
            <Td>
              <StripeIds entry={entry} />
            </Td>
          </tr>
        ))}
      </tbody>
    </Table>
  )
}
