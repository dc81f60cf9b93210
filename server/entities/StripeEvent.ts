import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm'

/** Every Stripe event handled, by id: a replayed or duplicated event is recognised and changes nothing. */
@Entity({ name: 'stripe_events' })
export class StripeEvent {
  @PrimaryColumn({ type: 'text' })
  id: string

  @Column({ type: 'text' })
  type: string

  @Column({ type: 'jsonb' })
  payload: Record<string, unknown>

  /** Why the event was not applied (malformed, an amount we did not ask for, …); the desk looks at these. */
  @Column({ type: 'text', nullable: true })
  problem: string | null

  @CreateDateColumn({ name: 'received_at', type: 'timestamptz' })
  receivedAt: Date
}
