// The shapes the studio API answers with, from shared/api/studios.ts, and a few the client alone reads.
import type { PublicStudioJson, StudioJson, StudioRole } from '../../../../shared/api/studios'

export type { StudioRole, ExamplePrice } from '../../../../shared/api/studios'
export type {
  PublicStudioJson as PublicStudio,
  KilnJson as KilnRecord,
  KilnWithPricesJson as KilnWithPrices,
  FiringJson as FiringRecord,
} from '../../../../shared/api/studios'

/** What the studio's own people see: the public side plus the street address and their role. */
export interface MemberStudio extends StudioJson {
  myRole: StudioRole
}

export type Studio = PublicStudioJson | MemberStudio

export function isMemberView(studio: Studio): studio is MemberStudio {
  return 'myRole' in studio && (studio as MemberStudio).myRole !== null
}

export type {
  CrewMemberJson as CrewMember,
  CrewInviteJson as CrewInvite,
  InviteDetailsJson as InviteDetails,
} from '../../../../shared/api/studios'
