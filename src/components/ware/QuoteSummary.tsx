import { formatMoney } from '../../../shared/dates'
import type { Quote } from '../../../shared/firing/quote'

/**
 * A quote's lines, its total and the deposit. Once the studio has asked for a deposit, that figure is
 * shown as asked (it is never recomputed from a later price).
 */
export function QuoteSummary({ quote, deposit }: { quote: Quote; deposit?: { cents: number; label: string } }) {
  const money = (cents: number) => formatMoney(cents, quote.currency)
  return (
    <table className="w-full text-sm" data-testid="quote">
      <caption className="sr-only">Quote</caption>
      <tbody className="divide-y divide-slip-100">
        {quote.lines.map((line, index) => (
          <tr key={index}>
            <th scope="row" className="py-1.5 pr-3 text-left font-normal text-slip-700">
              {line.label}
            </th>
            <td className="py-1.5 text-right tabular-nums">{money(line.amountCents)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot className="border-t border-slip-300">
        <tr>
          <th scope="row" className="py-1.5 pr-3 text-left font-semibold">
            Total
          </th>
          <td className="py-1.5 text-right font-semibold tabular-nums">{money(quote.totalCents)}</td>
        </tr>
        <tr>
          <th scope="row" className="py-1 pr-3 text-left font-normal text-slip-600">
            {deposit?.label ?? 'Deposit to hold the space'}
          </th>
          <td className="py-1 text-right tabular-nums text-slip-700" data-testid="quote-deposit">
            {money(deposit?.cents ?? quote.depositCents)}
          </td>
        </tr>
      </tfoot>
    </table>
  )
}
