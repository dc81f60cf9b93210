import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import type { Finding, Piece, Verdict } from '../../shared/firing/check'
import type { Quote } from '../../shared/firing/quote'
import { REQUEST_STATES, type RequestState } from '../../shared/workflow/request-states'
import type { Firing } from './Firing'
import type { User } from './User'

/** A potter's request for space in one firing, from draft to collection. */
@Entity({ name: 'firing_requests' })
@Index('firing_requests_firing_state_idx', ['firingId', 'state'])
@Index('firing_requests_potter_idx', ['potterId'])
@Check('firing_requests_state_check', `"state" IN (${REQUEST_STATES.map((s) => `'${s}'`).join(', ')})`)
@Check('firing_requests_volume_check', `"volume_l" >= 0`)
export class FiringRequest {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @ManyToOne('Firing', { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'firing_id' })
  firing: Firing

  @Column({ name: 'potter_id', type: 'uuid' })
  potterId: string

  @ManyToOne('User', { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'potter_id' })
  potter: User

  @Column({ type: 'text', default: 'draft' })
  state: RequestState

  /** The ware as declared, SI units (shared/firing/check.ts Piece). */
  @Column({ type: 'jsonb' })
  pieces: Piece[]

  @Column({ type: 'text', default: '' })
  notes: string

  /** Bounding-box litres of the ware: the space the request holds once accepted. */
  @Column({ name: 'volume_l', type: 'double precision' })
  volumeL: number

  /** The server's last ware check of these pieces against this firing. */
  @Column({ type: 'text' })
  verdict: Verdict

  @Column({ type: 'jsonb', default: [] })
  findings: Finding[]

  /** Warning codes the potter acknowledged one by one when sending. */
  @Column({ name: 'acknowledged_warnings', type: 'text', array: true, default: '{}' })
  acknowledgedWarnings: string[]

  /** The price as quoted when the request was sent: what the potter agreed to. */
  @Column({ type: 'jsonb', nullable: true })
  quote: Quote | null

  /** The price that stands now: the sent quote, or the measured one at check-in once it stands. */
  @Column({ name: 'standing_quote', type: 'jsonb', nullable: true })
  standingQuote: Quote | null

  /** A higher price from the measured ware, waiting for the potter to confirm or turn down. */
  @Column({ name: 'pending_quote', type: 'jsonb', nullable: true })
  pendingQuote: Quote | null

  /** The deposit asked when the studio took the request on; never recomputed afterwards. */
  @Column({ name: 'deposit_asked_cents', type: 'integer', nullable: true })
  depositAskedCents: number | null

  /** The version of the studio's policies the potter agreed to when sending. */
  @Column({ name: 'policies_version', type: 'integer', nullable: true })
  policiesVersion: number | null

  @Column({ name: 'deposit_due_at', type: 'timestamptz', nullable: true })
  depositDueAt: Date | null

  /** Another firing of the same studio the studio proposes instead; the potter accepts or refuses. */
  @Column({ name: 'proposed_firing_id', type: 'uuid', nullable: true })
  proposedFiringId: string | null

  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true })
  sentAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
