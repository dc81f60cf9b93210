// What the front desk's routes answer with (server/services/admin.ts), declared once for the routes
// and the desk's pages.
import type { UserRole } from '../schemas/auth'
import type { RequestRow } from './requests'

/** One page of a long list, with how many match in all. */
export interface DeskPage {
  total: number
  page: number
  perPage: number
}

export interface DeskStudio {
  id: string
  name: string
  city: string
  region: string
  published: boolean
  verified: boolean
  createdAt: string
  kilns: number
  upcomingFirings: number
  owners: { name: string; email: string }[]
}

export interface DeskStudioList extends DeskPage {
  studios: DeskStudio[]
}

export interface DeskAccount {
  id: string
  email: string
  displayName: string
  role: UserRole
  suspended: boolean
  createdAt: string
  /** The admin reading the list: their own account is never offered for suspension. */
  self: boolean
}

export interface DeskAccountList extends DeskPage {
  users: DeskAccount[]
}

/** Why a request is disputed, in the words of whoever raised it. */
export interface DisputeReason {
  reason: string
  raisedBy: 'potter' | 'studio' | 'desk'
  raisedByName: string
  at: string
}

export interface DeskDispute extends RequestRow {
  dispute: DisputeReason | null
}
