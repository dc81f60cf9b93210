import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

/**
 * Money taken at the studio's counter that is owed back (a withdrawal, a lapse, a refusal at the
 * door): Stripe cannot return it, so the studio does, and marks it paid. Shown to the studio until then.
 */
@Entity({ name: 'counter_refunds' })
@Index('counter_refunds_request_idx', ['requestId'])
@Check('counter_refunds_amount_check', `"amount_cents" > 0`)
export class CounterRefund {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'amount_cents', type: 'integer' })
  amountCents: number

  @Column({ type: 'char', length: 3 })
  currency: string

  @Column({ type: 'text', default: '' })
  reason: string

  @Column({ name: 'paid_at', type: 'timestamptz', nullable: true })
  paidAt: Date | null

  @Column({ name: 'paid_by', type: 'uuid', nullable: true })
  paidBy: string | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
