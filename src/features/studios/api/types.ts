// The shapes the studio API answers with (see server/services/studios.ts, kilns.ts, firings.ts).
import type { Kiln as KilnSpec } from '../../../../shared/firing/check'
import type { PriceList, Quote } from '../../../../shared/firing/quote'
import type { StudioPolicies } from '../../../../shared/schemas/studios'
import type { FiringStatus } from '../../../../shared/workflow/firing-status'

export type StudioRole = 'owner' | 'crew'

export interface PublicStudio {
  id: string
  name: string
  description: string
  city: string
  region: string
  country: string
  postalCode: string | null
  lat: number
  lng: number
  timezone: string
  currency: string
  dropOffHours: string
  policies: StudioPolicies
  policiesVersion: number
  published: boolean
  verified: boolean
}

/** What the studio's own people see: the public side plus the street address and their role. */
export interface MemberStudio extends PublicStudio {
  address: string | null
  myRole: StudioRole
  createdAt: string
}

export type Studio = PublicStudio | MemberStudio

export function isMemberView(studio: Studio): studio is MemberStudio {
  return 'myRole' in studio && (studio as MemberStudio).myRole !== null
}

export interface ExamplePrice {
  label: string
  quote: Quote
}

export interface KilnRecord extends KilnSpec {
  id: string
  studioId: string
  name: string
  shelfCount: number
  shelfWidthMm: number | null
  shelfDepthMm: number | null
  notes: string
  retired: boolean
  effectiveUsableHeightMm: number
  volumeL: number
}

export interface KilnWithPrices extends KilnRecord {
  priceList: PriceList | null
  examplePrices: ExamplePrice[]
}

export interface FiringRecord {
  id: string
  kilnId: string
  studioId: string
  kind: 'bisque' | 'glaze' | 'single'
  cone: string
  atmosphere: 'oxidation' | 'reduction' | 'neutral'
  slowCool: boolean
  dropOffBy: string
  firingDate: string
  readyBy: string
  capacityL: number
  heldL: number
  spaceLeftL: number
  status: FiringStatus
  nextStatuses: FiringStatus[]
  schedule: unknown
  notes: string
  seriesId: string | null
  cancelledReason: string | null
}

export interface CrewMember {
  id: string
  userId: string
  displayName: string
  email: string
  role: StudioRole
  since: string
}

export interface CrewInvite {
  id: string
  email: string
  expiresAt: string
}

export interface InviteDetails {
  studioId: string
  studioName: string
  email: string
  expiresAt: string
}
