import { Check, Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'

/** `counter-refund`: money handed back at the counter (what Stripe could not return). */
/** `claim`: a damage claim paid online; it is not toward the firing's price. */
export type LedgerKind = 'deposit' | 'balance' | 'refund' | 'counter' | 'counter-refund' | 'claim'

/**
 * One movement of money for a request: what came in (deposit, balance, paid at the counter) and what
 * went back (refunds). Amounts are positive integer cents; `direction` says which way.
 */
@Entity({ name: 'ledger_entries' })
@Index('ledger_entries_request_idx', ['requestId', 'at'])
@Check('ledger_entries_direction_check', `"direction" IN ('in', 'out')`)
@Check('ledger_entries_kind_check', `"kind" IN ('deposit', 'balance', 'refund', 'counter', 'counter-refund', 'claim')`)
@Check('ledger_entries_amount_check', `"amount_cents" > 0`)
export class LedgerEntry {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @Column({ type: 'text' })
  direction: 'in' | 'out'

  @Column({ type: 'text' })
  kind: LedgerKind

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ name: 'stripe_session_id', type: 'text', nullable: true })
  stripeSessionId: string | null

  @Column({ name: 'stripe_payment_intent_id', type: 'text', nullable: true })
  stripePaymentIntentId: string | null

  /** Unique: a refund is booked once, however many times Stripe tells us about it. */
  @Index('ledger_entries_refund_key', { unique: true, where: `"stripe_refund_id" IS NOT NULL` })
  @Column({ name: 'stripe_refund_id', type: 'text', nullable: true })
  stripeRefundId: string | null

  @Column({ type: 'text', default: '' })
  note: string

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date
}
