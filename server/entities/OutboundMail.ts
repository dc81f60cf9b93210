import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm'

/**
 * A mail written in the same transaction as the change that causes it; the worker sends it and
 * stamps `sentAt`, so a crash or an SMTP outage neither loses it nor sends it twice.
 */
@Entity({ name: 'outbound_mail' })
export class OutboundMail {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'to_address', type: 'text' })
  toAddress: string

  @Column({ type: 'text' })
  template: string

  @Column({ type: 'text' })
  subject: string

  @Column({ name: 'body_text', type: 'text' })
  bodyText: string

  @Column({ name: 'body_html', type: 'text' })
  bodyHtml: string

  @Column({ type: 'integer', default: 0 })
  attempts: number

  @Column({ name: 'last_error', type: 'text', nullable: true })
  lastError: string | null

  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true })
  sentAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
