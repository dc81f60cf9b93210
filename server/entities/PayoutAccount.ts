import { Column, CreateDateColumn, Entity, Index, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { Studio } from './Studio'

/**
 * A studio's Stripe connected account (Express), where its share of each firing is transferred, and
 * what Stripe last said of it: whether it may receive transfers, what is still due. Kept current by
 * the `account.updated` webhook; only the studio's owner sees it.
 */
@Entity({ name: 'payout_accounts' })
export class PayoutAccount {
  @PrimaryColumn({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @OneToOne('Studio', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio

  @Index('payout_accounts_stripe_key', { unique: true })
  @Column({ name: 'stripe_account_id', type: 'text' })
  stripeAccountId: string

  @Column({ name: 'details_submitted', type: 'boolean', default: false })
  detailsSubmitted: boolean

  /** The `transfers` capability: active, pending or inactive. */
  @Column({ name: 'transfers_status', type: 'text', nullable: true })
  transfersStatus: string | null

  @Column({ name: 'payouts_enabled', type: 'boolean', default: false })
  payoutsEnabled: boolean

  @Column({ name: 'currently_due', type: 'jsonb', default: () => `'[]'::jsonb` })
  currentlyDue: string[]

  @Column({ name: 'pending_verification', type: 'jsonb', default: () => `'[]'::jsonb` })
  pendingVerification: string[]

  @Column({ name: 'disabled_reason', type: 'text', nullable: true })
  disabledReason: string | null

  @Column({ name: 'bank_last4', type: 'text', nullable: true })
  bankLast4: string | null

  /** When Stripe's view of the account applied here was current: an older event changes nothing. */
  @Column({ name: 'stripe_seen_at', type: 'timestamptz', nullable: true })
  stripeSeenAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
