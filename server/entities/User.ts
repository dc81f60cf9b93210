import { Check, Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { USER_ROLES, type UserRole, type UnitSystem } from '../../shared/schemas/auth'

@Entity({ name: 'users' })
@Check('users_role_check', `"role" IN (${USER_ROLES.map((r) => `'${r}'`).join(', ')})`)
@Check('users_unit_system_check', `"unit_system" IN ('imperial', 'metric')`)
@Check('users_email_lower_check', `"email" = lower("email")`)
export class User {
  @PrimaryGeneratedColumn('uuid')
  id: string

  /** Stored lower-cased; the unique index is what stops two accounts sharing an address. */
  @Index('users_email_key', { unique: true })
  @Column({ type: 'text' })
  email: string

  @Column({ name: 'password_hash', type: 'text' })
  passwordHash: string

  @Column({ name: 'display_name', type: 'text' })
  displayName: string

  @Column({ type: 'text', enum: USER_ROLES })
  role: UserRole

  @Column({ name: 'unit_system', type: 'text', default: 'imperial' })
  unitSystem: UnitSystem

  @Column({ name: 'email_verified_at', type: 'timestamptz', nullable: true })
  emailVerifiedAt: Date | null

  @Column({ name: 'suspended_at', type: 'timestamptz', nullable: true })
  suspendedAt: Date | null

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
