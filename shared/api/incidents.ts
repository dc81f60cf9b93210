// Incidents and damage claims as the routes answer with them (server/services/incidents.ts and
// claims.ts) and the client reads them: declared once.
import type { ClaimAction, ClaimStatus, DamageChargeKind, DamageCharges } from '../claims'
import type { CrackEdge, Diagnosis, IncidentKind, IncidentPhase } from '../firing/incidents'
import type { FiringKind } from '../firing/check'
import type { RemedyKind } from '../remedies'
import type { PhotoJson } from './photos'

export interface IncidentPieceJson {
  tag: string
  label: string
  requestId: string
  potterName: string
  /** The piece that failed, or another potter's piece it hurt. */
  role: 'failed' | 'hurt'
}

export interface ClaimJson {
  id: string
  incidentId: string
  requestId: string
  chargeKind: DamageChargeKind
  chargeLabel: string
  amountCents: number
  currency: string
  note: string
  status: ClaimStatus
  statusLabel: string
  /** The potter's reason, once contested. */
  contestReason: string | null
  /** The desk's word, once decided. */
  deskNote: string | null
  potterName: string
  studioName: string
  /** What the viewer may do with it now. */
  actions: ClaimAction[]
  /** The card the potter kept at the deposit, named, when it can pay this claim now (the potter's view only). */
  keptCard: string | null
  at: string
  paidAt: string | null
}

/** The answer to paying a claim: the checkout page to go to, or the claim paid with the kept card. */
export type ClaimPayAnswer = { checkoutUrl: string; claim?: undefined } | { claim: ClaimJson; checkoutUrl?: undefined }

/** What the studio did to make good to one potter whose pieces the incident hurt. */
export interface RemedyJson {
  id: string
  incidentId: string
  /** The hurt potter's own ask. */
  requestId: string
  potterName: string
  kind: RemedyKind
  kindLabel: string
  /** A credit: the amount, the part refunded through Stripe and the part owed back at the counter. */
  amountCents: number | null
  onlineCents: number | null
  counterCents: number | null
  currency: string | null
  /** A free refire: the pieces promised, and the firing named for it, if any. */
  pieceTags: string[]
  targetFiring: { id: string; date: string; kilnName: string } | null
  note: string
  at: string
}

/** One hurt potter's ask as the studio's owner sees it when making good: the pieces, the photos, the money. */
export interface HurtAskJson {
  requestId: string
  potterName: string
  pieces: { tag: string; label: string; photos: PhotoJson[] }[]
  currency: string
  /** Paid on the ask and not had back: the most a credit may be. */
  creditableCents: number
  /** Why a credit cannot be given now (the ware not yet picked up, nothing paid), or null. */
  creditBlocked: string | null
  /** The kinds already given for this ask on this incident (one of each). */
  given: RemedyKind[]
}

/** A coming firing of the studio, to name for a free refire. */
export interface ComingFiringJson {
  id: string
  date: string
  kilnName: string
  firingKind: FiringKind
  cone: string
}

export interface IncidentSummaryJson {
  id: string
  firingId: string
  kind: IncidentKind
  kindLabel: string
  reportedBy: 'potter' | 'studio'
  reporterName: string
  at: string
  pieceTags: string[]
}

/** An incident in a firing's list, with what the studio did for hurt pieces as far as the viewer may see. */
export interface FiringIncidentJson extends IncidentSummaryJson {
  remedies: RemedyJson[]
}

export interface IncidentJson extends IncidentSummaryJson {
  studioId: string
  studioName: string
  /** The studio's time zone (IANA), in which its dates are shown. */
  timezone: string
  kilnName: string
  firingDate: string
  firingKind: FiringKind
  cone: string
  /** The ask whose ware failed. */
  requestId: string
  potterName: string
  crackEdge: CrackEdge | null
  shards: boolean
  neighboursHit: boolean
  shelfDamage: boolean
  elementDamage: boolean
  whereInKiln: string
  note: string
  pieces: IncidentPieceJson[]
  photos: PhotoJson[]
  /** Whether the firing's log had a curve to read. */
  logged: boolean
  diagnosis: Diagnosis
  claims: ClaimJson[]
  /** The viewer's standing: the studio may raise a claim; either side may add photos. */
  viewerSide: 'potter' | 'studio' | 'admin' | 'neighbour'
  canClaim: boolean
  damageCharges: DamageCharges
  /** The currency of the charges and of a claim raised on this incident. */
  claimCurrency: string
  /** What the studio did to make good: all of it for the studio and the desk, a potter's own for a potter. */
  remedies: RemedyJson[]
  /** The studio's owner may make good to hurt potters. */
  canMakeGood: boolean
  /** For the studio's owner: each hurt potter's ask. Empty for everyone else. */
  hurtAsks: HurtAskJson[]
  /** For the studio's owner: its coming firings, to name for a free refire. */
  comingFirings: ComingFiringJson[]
}

/** One row of a studio's incident history: counted by kiln, firing kind and phase. */
export interface IncidentHistoryRow {
  kilnId: string
  kilnName: string
  firingKind: FiringKind
  cone: string
  atmosphere: string
  phase: IncidentPhase | null
  phaseLabel: string
  count: number
  last: string
}

export interface StudioIncidentHistory {
  /** The studio's time zone (IANA), in which its dates are shown. */
  timezone: string
  rows: IncidentHistoryRow[]
  incidents: (IncidentSummaryJson & { kilnName: string; firingDate: string; phase: IncidentPhase | null })[]
}

/** A potter's record as a deciding studio sees it: incidents their ware caused, anywhere. */
export interface PotterIncidentRecord {
  count: number
  claimsPaid: number
  claimsWaived: number
  incidents: { kind: IncidentKind; kindLabel: string; at: string; studioName: string }[]
}
