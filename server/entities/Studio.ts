import { Check, Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm'
import { DEFAULT_CHECKLIST, type ChecklistItem } from '../../shared/schemas/pieces'
import type { StudioPolicies } from '../../shared/schemas/studios'
import type { Kiln } from './Kiln'
import type { StudioMember } from './StudioMember'

@Entity({ name: 'studios' })
@Check('studios_position_check', `"lat" BETWEEN -90 AND 90 AND "lng" BETWEEN -180 AND 180`)
@Check('studios_currency_check', `"currency" ~ '^[A-Z]{3}$'`)
export class Studio {
  @PrimaryGeneratedColumn('uuid')
  id: string

  @Column({ type: 'text' })
  name: string

  @Column({ type: 'text', default: '' })
  description: string

  /** Street and number; shown only to potters whose ware the studio has accepted. */
  @Column({ name: 'address_line', type: 'text', nullable: true })
  addressLine: string | null

  @Column({ name: 'postal_code', type: 'text', nullable: true })
  postalCode: string | null

  @Column({ type: 'text', default: '' })
  city: string

  @Column({ type: 'text', default: '' })
  region: string

  @Column({ type: 'text', default: 'US' })
  country: string

  @Column({ type: 'double precision' })
  lat: number

  @Column({ type: 'double precision' })
  lng: number

  /** IANA zone; deadlines and firing dates are shown in it. */
  @Column({ type: 'text' })
  timezone: string

  @Column({ type: 'char', length: 3, default: 'USD' })
  currency: string

  @Column({ name: 'drop_off_hours', type: 'text', default: '' })
  dropOffHours: string

  @Column({ type: 'jsonb' })
  policies: StudioPolicies

  /** Bumped on every change of the policies; a request records the version its potter agreed to. */
  @Column({ name: 'policies_version', type: 'integer', default: 1 })
  policiesVersion: number

  /** What the crew checks on every piece at drop-off (shared/schemas/pieces.ts). */
  @Column({ name: 'drop_off_checklist', type: 'jsonb', default: () => `'${JSON.stringify(DEFAULT_CHECKLIST).replace(/'/g, "''")}'::jsonb` })
  dropOffChecklist: ChecklistItem[]

  @Column({ type: 'boolean', default: false })
  published: boolean

  @Column({ name: 'verified_at', type: 'timestamptz', nullable: true })
  verifiedAt: Date | null

  @OneToMany('StudioMember', (member: StudioMember) => member.studio)
  members: StudioMember[]

  @OneToMany('Kiln', (kiln: Kiln) => kiln.studio)
  kilns: Kiln[]

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date
}
