// Balance transactions: every movement of funds on the platform's balance and on each connected
// account's, the record `GET /v1/balance` and `GET /v1/balance_transactions` read. The stand-in
// charges no processing fee (`fee` is 0) and makes funds available at once, where Stripe would hold
// a card payment for a few days; a transfer with `source_transaction` may spend pending funds anyway.
import { newId, type BalanceTransactionObject } from './objects'

/** The platform's own balance is kept under this key; connected accounts under their `acct_` id. */
const PLATFORM = 'platform'

export interface BalanceEntryInput {
  id?: string | null
  amount: number
  currency: string
  type: BalanceTransactionObject['type']
  source: string
  description?: string | null
  reportingCategory: string
}

export class BalanceBook {
  private entries = new Map<string, BalanceTransactionObject[]>()

  constructor(private readonly now: () => number) {}

  add(account: string | null, input: BalanceEntryInput): BalanceTransactionObject {
    const created = Math.floor(this.now() / 1000)
    const entry: BalanceTransactionObject = {
      id: input.id ?? newId.balanceTransaction(),
      object: 'balance_transaction',
      amount: input.amount,
      available_on: created,
      created,
      currency: input.currency,
      description: input.description ?? null,
      exchange_rate: null,
      fee: 0,
      fee_details: [],
      net: input.amount,
      reporting_category: input.reportingCategory,
      source: input.source,
      status: 'available',
      type: input.type,
    }
    const key = account ?? PLATFORM
    this.entries.set(key, [...(this.entries.get(key) ?? []), entry])
    return entry
  }

  /** Newest first, as Stripe lists them. */
  list(account: string | null, filter: { type?: string; source?: string } = {}): BalanceTransactionObject[] {
    return (this.entries.get(account ?? PLATFORM) ?? [])
      .filter((entry) => (!filter.type || entry.type === filter.type) && (!filter.source || entry.source === filter.source))
      .slice()
      .reverse()
  }

  get(account: string | null, id: string): BalanceTransactionObject | undefined {
    return (this.entries.get(account ?? PLATFORM) ?? []).find((entry) => entry.id === id)
  }

  /** Net funds per currency (smallest unit). */
  available(account: string | null): Map<string, number> {
    const totals = new Map<string, number>()
    for (const entry of this.entries.get(account ?? PLATFORM) ?? [])
      totals.set(entry.currency, (totals.get(entry.currency) ?? 0) + entry.net)
    return totals
  }

  snapshot(): [string, BalanceTransactionObject[]][] {
    return [...this.entries]
  }

  restore(entries: [string, BalanceTransactionObject[]][]): void {
    this.entries = new Map(entries)
  }
}
