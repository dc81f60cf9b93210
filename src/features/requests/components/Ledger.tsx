import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { Table, Td, Th } from '../../../components/ui/Table'
import type { LedgerEntry } from '../api/types'
import { shortStripeId } from '../requestWords'

const KIND_WORDS: Record<LedgerEntry['kind'], string> = {
  deposit: 'Deposit received',
  balance: 'Balance received',
  counter: 'Paid at the studio',
  refund: 'Refunded',
  'counter-refund': 'Handed back at the studio',
  claim: 'Damage claim paid',
}

const whatOf = (entry: LedgerEntry) => KIND_WORDS[entry.kind] ?? (entry.direction === 'in' ? 'Received' : 'Paid out')

/** How the money moved, in the words a person uses: by card online, or in hand at the counter. */
const howOf = (entry: LedgerEntry) => (entry.kind === 'counter' || entry.kind === 'counter-refund' ? 'Counter' : 'Card')

const referencesOf = (entry: LedgerEntry) =>
  [entry.stripePaymentIntentId, entry.stripeRefundId, entry.stripeSessionId].filter((id): id is string => Boolean(id))

/**
 * The card payments' references, shortened, for the studio or the desk to quote when they ask the
 * payment provider's support about one. Kept out of the main view behind a disclosure.
 */
function SupportReferences({ entries, zone }: { entries: LedgerEntry[]; zone: string }) {
  const withReferences = entries.filter((entry) => referencesOf(entry).length > 0)
  if (withReferences.length === 0) return null
  return (
    <details className="text-sm text-slip-700" data-testid="ledger-references">
      <summary className="focus-ring w-fit cursor-pointer rounded font-medium text-slip-800">References for support</summary>
      <ul className="mt-2 space-y-1">
        {withReferences.map((entry, index) => (
          <li key={index}>
            {whatOf(entry)}, {formatDateTime(entry.at, zone)}:{' '}
            {referencesOf(entry).map((id) => (
              <code key={id} className="mr-2 text-xs text-slip-700">
                {shortStripeId(id)}
              </code>
            ))}
          </li>
        ))}
      </ul>
    </details>
  )
}

/** Money in and out for this request: when, what, by card or at the counter, and how much. */
export function Ledger({ entries, zone, showReferences = false }: { entries: LedgerEntry[]; zone: string; showReferences?: boolean }) {
  if (entries.length === 0)
    return (
      <p className="text-sm text-slip-600" data-testid="ledger-empty">
        No money has moved yet.
      </p>
    )
  return (
    <div className="space-y-2">
      <Table caption="Money in and out">
        <thead>
          <tr>
            <Th>When</Th>
            <Th>What</Th>
            <Th>How</Th>
            <Th className="text-right">Amount</Th>
          </tr>
        </thead>
        <tbody className="divide-y divide-slip-100">
          {entries.map((entry, index) => (
            <tr key={index} data-testid="ledger-line" data-direction={entry.direction} data-kind={entry.kind}>
              <Td className="whitespace-nowrap">{formatDateTime(entry.at, zone)}</Td>
              <Td>
                {whatOf(entry)}
                {entry.note && <span className="block text-xs text-slip-600">{entry.note}</span>}
              </Td>
              <Td data-testid="ledger-how">{howOf(entry)}</Td>
              <Td
                className={`whitespace-nowrap text-right tabular-nums ${entry.direction === 'in' ? 'text-celadon-700' : 'text-danger-700'}`}
              >
                {entry.direction === 'in' ? '+' : '−'}
                {formatMoney(entry.amountCents, entry.currency)}
              </Td>
            </tr>
          ))}
        </tbody>
      </Table>
      {showReferences && <SupportReferences entries={entries} zone={zone} />}
    </div>
  )
}
