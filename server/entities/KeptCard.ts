import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, OneToOne, PrimaryColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

/**
 * A card the potter chose to keep on file when paying an ask's deposit: Stripe keeps it on the potter's
 * Customer (setup_future_usage off_session) and we keep its id and what a person recognises it by. It
 * pays only a damage claim on that ask that the potter accepts; the potter can forget it at any time.
 */
@Entity({ name: 'kept_cards' })
@Index('kept_cards_user_idx', ['userId'])
@Check('kept_cards_customer_check', `"stripe_customer_id" ~ '^cus_'`)
@Check('kept_cards_kept_check', `("stripe_payment_method_id" IS NULL) = ("kept_at" IS NULL)`)
export class KeptCard {
  @PrimaryColumn({ name: 'request_id', type: 'uuid' })
  requestId: string

  @OneToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ name: 'user_id', type: 'uuid' })
  userId: string

  @Column({ name: 'stripe_customer_id', type: 'text' })
  stripeCustomerId: string

  /** Set once the deposit is paid and Stripe has attached the card. */
  @Column({ name: 'stripe_payment_method_id', type: 'text', nullable: true })
  stripePaymentMethodId: string | null

  @Column({ type: 'text', nullable: true })
  brand: string | null

  @Column({ type: 'text', nullable: true })
  last4: string | null

  @Column({ name: 'kept_at', type: 'timestamptz', nullable: true })
  keptAt: Date | null

  /** When the potter asked us to forget it (the card is detached from the Customer then). */
  @Column({ name: 'forgotten_at', type: 'timestamptz', nullable: true })
  forgottenAt: Date | null

  @CreateDateColumn({ name: 'agreed_at', type: 'timestamptz' })
  agreedAt: Date
}
