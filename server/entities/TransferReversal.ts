import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { StudioTransfer } from './StudioTransfer'

/** Part of a transfer taken back from the studio (its share of a refund), recorded once. */
@Entity({ name: 'transfer_reversals' })
@Index('transfer_reversals_request_idx', ['requestId'])
@Check('transfer_reversals_amount_check', `"amount_cents" > 0`)
export class TransferReversal {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'transfer_id', type: 'uuid' })
  transferId: string

  @ManyToOne('StudioTransfer', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'transfer_id' })
  transfer: StudioTransfer

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @Index('transfer_reversals_stripe_key', { unique: true })
  @Column({ name: 'stripe_reversal_id', type: 'text' })
  stripeReversalId: string

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
