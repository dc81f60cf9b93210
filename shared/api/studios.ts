// The shapes the studio, kiln and firing routes answer with: written by the server, read by the
// client, declared once.
import type { Atmosphere, CoolingProfile, FiringKind, Kiln } from '../firing/check'
import type { LoadRoom } from '../firing/load'
import type { PriceList, Quote } from '../firing/quote'
import type { Segment } from '../firing/schedule'
import type { ChecklistItem } from '../schemas/pieces'
import type { AnswerTally, StudioQuestion } from '../reviews'
import type { StudioPolicies } from '../schemas/studios'
import type { FiringStatus } from '../workflow/firing-status'
import type { ReviewJson } from './requests'

export type StudioRole = 'owner' | 'crew'

/** What anyone may see of a published studio. */
export interface PublicStudioJson {
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
  /** What the crew checks on every piece at drop-off. */
  dropOffChecklist: ChecklistItem[]
  published: boolean
  verified: boolean
}

/** What the studio's own people see as well: the street address and their role. */
export interface StudioJson extends PublicStudioJson {
  address: string | null
  myRole: StudioRole | null
  createdAt: string
}

export interface KilnJson extends Kiln {
  id: string
  studioId: string
  name: string
  shelfCount: number
  shelfWidthMm: number | null
  shelfDepthMm: number | null
  notes: string
  retired: boolean
  /** The usable height in force (given, or derived from the interior). */
  effectiveUsableHeightMm: number
  volumeL: number
}

export interface ExamplePrice {
  label: string
  quote: Quote
}

export interface KilnWithPricesJson extends KilnJson {
  priceList: PriceList | null
  examplePrices: ExamplePrice[]
}

export interface FiringJson {
  id: string
  kilnId: string
  studioId: string
  kind: FiringKind
  cone: string
  atmosphere: Atmosphere
  slowCool: boolean
  cooling: CoolingProfile
  dropOffBy: string
  firingDate: string
  readyBy: string
  /** Layers on sale; null when every layer the kiln's shelves make is. */
  layersOnSale: number | null
  /** What the load plan can still take, by height band, in shelves. */
  space: LoadRoom
  status: FiringStatus
  nextStatuses: readonly FiringStatus[]
  schedule: Segment[] | null
  notes: string
  seriesId: string | null
  cancelledReason: string | null
  /** The last stage move while it can still be undone: back to `from`, until `until`. */
  undo: { from: FiringStatus; until: string } | null
}

/** A studio's published answers from potters, as its public page shows them. */
export interface StudioReviewsJson {
  summary: {
    count: number
    /** How many of them would fire there again. */
    fireAgain: number
    /** The ranking score (shared/reviews fireAgainScore); null with no published answers. */
    score: number | null
    questions: Record<StudioQuestion, AnswerTally>
  }
  /** Newest first, with the potter's first name. */
  reviews: (ReviewJson & { author: string })[]
}

/** A member of a studio's crew, as its owner sees them (server/services/crew.ts). */
export interface CrewMemberJson {
  id: string
  userId: string
  displayName: string
  email: string
  role: StudioRole
  since: string
}

/** An invitation still waiting for its invitee. */
export interface CrewInviteJson {
  id: string
  email: string
  expiresAt: string
}

/** What an invitation link shows before the invitee joins. */
export interface InviteDetailsJson {
  studioId: string
  studioName: string
  email: string
  expiresAt: string
}
