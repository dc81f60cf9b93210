import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { RequestState } from '../../shared/workflow/request-states'
import type { FiringRequest } from './FiringRequest'

/** One change of a request's state: who, when, from, to and why. The request's timeline. */
@Entity({ name: 'request_events' })
@Index('request_events_request_idx', ['requestId', 'at'])
export class RequestEvent {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @ManyToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  /** Null when the system made the change (an expired deposit hold, a webhook). */
  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId: string | null

  @Column({ name: 'from_state', type: 'text', nullable: true })
  fromState: RequestState | null

  @Column({ name: 'to_state', type: 'text' })
  toState: RequestState

  @Column({ type: 'text', default: '' })
  reason: string

  @Column({ type: 'jsonb', default: {} })
  data: Record<string, unknown>

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date
}
