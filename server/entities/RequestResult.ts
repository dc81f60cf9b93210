import { Column, CreateDateColumn, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

/** The results of one request, posted once every piece in the load has its outcome (on the piece): notes for the potter. */
@Entity({ name: 'request_results' })
export class RequestResult {
  @PrimaryColumn({ name: 'request_id', type: 'uuid' })
  requestId: string

  @OneToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ type: 'text', default: '' })
  notes: string

  @Column({ name: 'posted_by', type: 'uuid' })
  postedBy: string

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
