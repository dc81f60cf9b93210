import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { User } from './User'

/**
 * An in-app notice: the same events that send mail, kept for the person's notice list so nobody has
 * to read mail to work the board. Written in the same transaction as the change it tells of.
 */
@Entity({ name: 'notices' })
@Index('notices_user_idx', ['userId', 'createdAt'])
// A partial index on unread notices per user, written by hand in the migration.
@Index('notices_unread_idx', { synchronize: false })
export class Notice {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'user_id', type: 'uuid' })
  userId: string

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User

  /** What happened, as a stable code (e.g. `price-raised`, `lapsed`, `balance-paid`). */
  @Column({ type: 'text' })
  kind: string

  @Column({ type: 'text' })
  title: string

  @Column({ type: 'text', default: '' })
  body: string

  /** Where in the app the notice leads (a path such as /requests/…). */
  @Column({ type: 'text' })
  path: string

  @Column({ name: 'request_id', type: 'uuid', nullable: true })
  requestId: string | null

  @Column({ name: 'firing_id', type: 'uuid', nullable: true })
  firingId: string | null

  /** The firing stage move that caused it, so an undo can take it back. */
  @Column({ name: 'firing_event_id', type: 'uuid', nullable: true })
  firingEventId: string | null

  @Column({ name: 'read_at', type: 'timestamptz', nullable: true })
  readAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
