import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

/** A Stripe transfer of a studio's share of a request to its connected account, recorded once. */
@Entity({ name: 'studio_transfers' })
@Index('studio_transfers_request_idx', ['requestId'])
@Index('studio_transfers_studio_idx', ['studioId', 'createdAt'])
@Check('studio_transfers_amount_check', `"amount_cents" > 0`)
export class StudioTransfer {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Index('studio_transfers_stripe_key', { unique: true })
  @Column({ name: 'stripe_transfer_id', type: 'text' })
  stripeTransferId: string

  @Column({ name: 'stripe_account_id', type: 'text' })
  stripeAccountId: string

  /** The charge it was paid from (`source_transaction`). */
  @Column({ name: 'source_charge_id', type: 'text', nullable: true })
  sourceChargeId: string | null

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  /** When Stripe made it. */
  @Column({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
