import { Check, Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'

/** A Stripe Checkout Session opened for a request's deposit or balance, or a damage claim on it. */
@Entity({ name: 'payments' })
@Index('payments_request_idx', ['requestId', 'purpose'])
@Check('payments_purpose_check', `"purpose" IN ('deposit', 'balance', 'claim')`)
@Check('payments_claim_check', `("purpose" = 'claim') = ("claim_id" IS NOT NULL)`)
@Check('payments_keeps_card_check', `NOT "keeps_card" OR "purpose" = 'deposit'`)
@Check('payments_status_check', `"status" IN ('open', 'paid', 'expired', 'failed')`)
export class Payment {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @Column({ type: 'text' })
  purpose: 'deposit' | 'balance' | 'claim'

  /** The damage claim a claim payment pays. */
  @Column({ name: 'claim_id', type: 'uuid', nullable: true })
  claimId: string | null

  @Index('payments_session_key', { unique: true })
  @Column({ name: 'stripe_session_id', type: 'text' })
  stripeSessionId: string

  @Column({ name: 'checkout_url', type: 'text' })
  checkoutUrl: string

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ type: 'text', default: 'open' })
  status: 'open' | 'paid' | 'expired' | 'failed'

  @Column({ name: 'stripe_payment_intent_id', type: 'text', nullable: true })
  stripePaymentIntentId: string | null

  /** The potter asked to keep the card this page takes (a deposit only): it is saved for off-session use. */
  @Column({ name: 'keeps_card', type: 'boolean', default: false })
  keepsCard: boolean

  /** Why the last attempt on the hosted page failed, as Stripe said it. */
  @Column({ name: 'failure_message', type: 'text', nullable: true })
  failureMessage: string | null

  @Column({ name: 'expires_at', type: 'timestamptz' })
  expiresAt: Date

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
