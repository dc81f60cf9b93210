import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm'

/** A message in a request's thread between the potter and the studio's people. */
@Entity({ name: 'request_messages' })
@Index('request_messages_request_idx', ['requestId', 'createdAt'])
export class RequestMessage {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'request_id', type: 'uuid' })
  requestId: string

  @Column({ name: 'author_id', type: 'uuid' })
  authorId: string

  /** Which side wrote it: the mail goes to the other side. */
  @Column({ type: 'text' })
  side: 'potter' | 'studio'

  @Column({ type: 'text' })
  body: string

  /** Set once the other side has been mailed about it. */
  @Column({ name: 'notified_at', type: 'timestamptz', nullable: true })
  notifiedAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
