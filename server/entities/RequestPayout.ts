import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

/**
 * A request whose studio's share is earned (collected, or ended with money the studio keeps): the
 * fee rule in force at that moment, when the share may be sent, and a dispute's settlement.
 */
@Entity({ name: 'request_payouts' })
@Index('request_payouts_studio_idx', ['studioId', 'earnedAt'])
@Check('request_payouts_fee_check', `"fee_percent_bp" BETWEEN 0 AND 10000 AND "fee_minimum_cents" >= 0`)
export class RequestPayout {
  @PrimaryColumn({ name: 'request_id', type: 'uuid' })
  requestId: string

  @OneToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ name: 'fee_percent_bp', type: 'integer' })
  feePercentBp: number

  @Column({ name: 'fee_minimum_cents', type: 'integer' })
  feeMinimumCents: number

  /** When the request reached its earning state: its month on the studio's statement. */
  @Column({ name: 'earned_at', type: 'timestamptz' })
  earnedAt: Date

  /** Not sent before this (the hold after collection); null sends at once. */
  @Column({ name: 'release_at', type: 'timestamptz', nullable: true })
  releaseAt: Date | null

  /** Set when the desk settles a dispute: the held share may then be sent. */
  @Column({ name: 'dispute_settled_at', type: 'timestamptz', nullable: true })
  disputeSettledAt: Date | null

  /** Set when a payout run found nothing left to send or take back; cleared whenever the money changes. */
  @Column({ name: 'paid_up_at', type: 'timestamptz', nullable: true })
  paidUpAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
