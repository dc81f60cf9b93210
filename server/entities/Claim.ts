import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { CLAIM_STATUSES, DAMAGE_CHARGE_KINDS, type ClaimStatus, type DamageChargeKind } from '../../shared/claims'
import type { FiringRequest } from './FiringRequest'
import type { Incident } from './Incident'

const list = (values: readonly string[]) => values.map((v) => `'${v}'`).join(', ')

/**
 * A damage charge the studio raises on the potter whose ware caused an incident, within its terms. Paid
 * through a checkout page on the ask (so it joins the ask's ledger and the studio's payout), or
 * contested and decided by the front desk.
 */
@Entity({ name: 'claims' })
@Index('claims_incident_idx', ['incidentId'])
@Index('claims_request_idx', ['requestId'])
@Check('claims_kind_check', `"charge_kind" IN (${list(DAMAGE_CHARGE_KINDS)})`)
@Check('claims_status_check', `"status" IN (${list(CLAIM_STATUSES)})`)
@Check('claims_amount_check', `"amount_cents" > 0`)
@Check('claims_paid_check', `("status" = 'paid') = ("paid_at" IS NOT NULL)`)
export class Claim {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'incident_id', type: 'uuid' })
  incidentId: string

  @ManyToOne('Incident', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'incident_id' })
  incident: Incident

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'raised_by', type: 'uuid' })
  raisedBy: string

  @Column({ name: 'charge_kind', type: 'text' })
  chargeKind: DamageChargeKind

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ type: 'text', default: '' })
  note: string

  @Column({ type: 'text', default: 'raised' })
  status: ClaimStatus

  @Column({ name: 'contest_reason', type: 'text', nullable: true })
  contestReason: string | null

  @Column({ name: 'desk_note', type: 'text', nullable: true })
  deskNote: string | null

  /** Declined tries on the kept card: each new try is a new payment to Stripe, a retry of one is the same. */
  @Column({ name: 'card_tries', type: 'integer', default: 0 })
  cardTries: number

  @Column({ name: 'paid_at', type: 'timestamptz', nullable: true })
  paidAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
