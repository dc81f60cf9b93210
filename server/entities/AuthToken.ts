import { Check, Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm'
import type { User } from './User'

export type TokenPurpose = 'verify-email' | 'password-reset' | 'crew-invite' | 'sign-in-link'

/** A single-use link token. Only its SHA-256 is stored, so a leaked table opens no accounts. */
@Entity({ name: 'auth_tokens' })
@Check('auth_tokens_purpose_check', `"purpose" IN ('verify-email', 'password-reset', 'crew-invite', 'sign-in-link')`)
export class AuthToken {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Index('auth_tokens_hash_key', { unique: true })
  @Column({ name: 'token_hash', type: 'text' })
  tokenHash: string

  @Column({ type: 'text' })
  purpose: TokenPurpose

  @Column({ name: 'user_id', type: 'uuid', nullable: true })
  userId: string | null

  @ManyToOne('User', { onDelete: 'CASCADE', nullable: true })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'auth_tokens_user_fk' })
  user: User | null

  /** Purpose-specific facts, e.g. the studio and address a crew invitation is for. */
  @Column({ type: 'jsonb', default: {} })
  data: Record<string, unknown>

  @Column({ name: 'expires_at', type: 'timestamptz' })
  expiresAt: Date

  @Column({ name: 'used_at', type: 'timestamptz', nullable: true })
  usedAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
