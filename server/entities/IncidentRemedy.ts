import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { REMEDY_KINDS, type RemedyKind } from '../../shared/remedies'
import type { Firing } from './Firing'
import type { FiringRequest } from './FiringRequest'
import type { Incident } from './Incident'

const list = (values: readonly string[]) => values.map((v) => `'${v}'`).join(', ')

/**
 * What the studio did to make good to a potter whose pieces an incident hurt, on that potter's own
 * ask: a credit (money given back, through Stripe on what was paid online and the rest owed at the
 * counter) or a promise to refire named pieces free, perhaps in a firing it names. One of each kind
 * per incident and hurt ask.
 */
@Entity({ name: 'incident_remedies' })
@Index('incident_remedies_once_idx', ['incidentId', 'requestId', 'kind'], { unique: true })
@Index('incident_remedies_request_idx', ['requestId'])
@Check('incident_remedies_kind_check', `"kind" IN (${list(REMEDY_KINDS)})`)
@Check(
  'incident_remedies_credit_check',
  `("kind" = 'credit') = ("amount_cents" IS NOT NULL) AND ("amount_cents" IS NULL OR ("amount_cents" > 0 AND "online_cents" >= 0 AND "counter_cents" >= 0 AND "online_cents" + "counter_cents" = "amount_cents" AND "currency" IS NOT NULL))`,
)
@Check(
  'incident_remedies_refire_check',
  `("kind" = 'refire') = (cardinality("piece_tags") > 0) AND ("kind" = 'refire' OR "target_firing_id" IS NULL)`,
)
export class IncidentRemedy {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'incident_id', type: 'uuid' })
  incidentId: string

  @ManyToOne('Incident', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'incident_id' })
  incident: Incident

  /** The hurt potter's own ask, on which the credit is given back and the promise recorded. */
  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ type: 'text' })
  kind: RemedyKind

  @Column({ name: 'amount_cents', type: 'integer', nullable: true })
  amountCents: number | null

  /** The part of a credit refunded through Stripe. */
  @Column({ name: 'online_cents', type: 'integer', nullable: true })
  onlineCents: number | null

  /** The part of a credit the studio owes back at its counter. */
  @Column({ name: 'counter_cents', type: 'integer', nullable: true })
  counterCents: number | null

  @Column({ type: 'char', length: 3, nullable: true })
  currency: string | null

  /** The pieces promised a free refire, by tag. */
  @Column({ name: 'piece_tags', type: 'text', array: true, default: () => "'{}'" })
  pieceTags: string[]

  /** The coming firing the studio means to refire them in, when it has chosen one. */
  @Column({ name: 'target_firing_id', type: 'uuid', nullable: true })
  targetFiringId: string | null

  @ManyToOne('Firing', { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'target_firing_id' })
  targetFiring: Firing | null

  @Column({ type: 'text', default: '' })
  note: string

  @Column({ name: 'given_by', type: 'uuid' })
  givenBy: string

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
