import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import { FIRING_STATUSES, type FiringStatus } from '../../shared/workflow/firing-status'
import type { RequestState } from '../../shared/workflow/request-states'
import type { Firing } from './Firing'

/** What a stage move did to the requests in the firing, so an undo can put each one back. */
export interface FiringMoveEffects {
  requests: { requestId: string; from: RequestState; to: RequestState }[]
  /** Jobs held back until the undo window closes (mail, refunds), removed by an undo. */
  jobKeys: string[]
  /** The held mails themselves, deleted by an undo so they are never sent. */
  mailIds: string[]
  /** Counter refunds recorded as due by the move, taken back by an undo. */
  counterRefundIds: string[]
}

const LIST = FIRING_STATUSES.map((s) => `'${s}'`).join(', ')

/** One status change of a firing: who, when, from, to; undone within the undo window or kept. */
@Entity({ name: 'firing_events' })
@Index('firing_events_firing_idx', ['firingId', 'at'])
@Check('firing_events_status_check', `"from_status" IN (${LIST}) AND "to_status" IN (${LIST})`)
export class FiringEvent {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'firing_id', type: 'uuid' })
  firingId: string

  @ManyToOne('Firing', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'firing_id' })
  firing: Firing

  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId: string | null

  @Column({ name: 'from_status', type: 'text' })
  fromStatus: FiringStatus

  @Column({ name: 'to_status', type: 'text' })
  toStatus: FiringStatus

  @Column({ type: 'text', default: '' })
  reason: string

  @Column({ type: 'jsonb', default: { requests: [], jobKeys: [], mailIds: [], counterRefundIds: [] } })
  effects: FiringMoveEffects

  @Column({ name: 'undone_at', type: 'timestamptz', nullable: true })
  undoneAt: Date | null

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date
}
