import { Check, Column, Index, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm'
import type { Studio } from './Studio'
import type { User } from './User'

export type StudioRole = 'owner' | 'crew'

@Entity({ name: 'studio_members' })
@Index('studio_members_user_idx', ['userId'])
@Check('studio_members_role_check', `"role" IN ('owner', 'crew')`)
@Unique('studio_members_studio_user_key', ['studioId', 'userId'])
export class StudioMember {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ name: 'studio_id', type: 'uuid' })
  studioId: string

  @ManyToOne('Studio', (studio: Studio) => studio.members, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'studio_id' })
  studio: Studio

  @Column({ name: 'user_id', type: 'uuid' })
  userId: string

  @ManyToOne('User', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: User

  @Column({ type: 'text' })
  role: StudioRole

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date
}
