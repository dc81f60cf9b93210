import { Check, Column, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'

/** A payout from a studio's connected account to its bank, as Stripe reports it (payout.* events). */
@Entity({ name: 'studio_payouts' })
@Index('studio_payouts_studio_idx', ['studioId', 'createdAt'])
@Check('studio_payouts_amount_check', `"amount_cents" >= 0`)
export class StudioPayout {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Index('studio_payouts_stripe_key', { unique: true })
  @Column({ name: 'stripe_payout_id', type: 'text' })
  stripePayoutId: string

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  /** Stripe's words: pending, in_transit, paid, failed, canceled. */
  @Column({ type: 'text' })
  status: string

  @Column({ name: 'arrival_date', type: 'timestamptz' })
  arrivalDate: Date

  @Column({ name: 'failure_message', type: 'text', nullable: true })
  failureMessage: string | null

  /** When Stripe made it. */
  @Column({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  /** The event that last changed it: an older one changes nothing. */
  @Column({ name: 'stripe_seen_at', type: 'timestamptz' })
  stripeSeenAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
