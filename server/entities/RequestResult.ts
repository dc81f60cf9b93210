import { Column, CreateDateColumn, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn } from 'typeorm'
import type { FiringRequest } from './FiringRequest'

export type PieceOutcome = 'fine' | 'cracked' | 'blown-out' | 'glaze-ran' | 'stuck-to-shelf' | 'other'

/** What came out of the kiln for one request: an outcome per piece, with notes. */
@Entity({ name: 'request_results' })
export class RequestResult {
  @PrimaryColumn({ name: 'request_id', type: 'uuid' })
  requestId: string

  @OneToOne('FiringRequest', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'request_id' })
  request: FiringRequest

  @Column({ type: 'jsonb' })
  outcomes: { pieceIndex: number; outcome: PieceOutcome; notes: string }[]

  @Column({ type: 'text', default: '' })
  notes: string

  @Column({ name: 'posted_by', type: 'uuid' })
  postedBy: string

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
