// The front desk's list queries: words, filters, order and page, validated on the route and built by
// the desk's tables. The lists can grow long, so the server pages and filters them.
import { z } from 'zod'
import { text } from './text'
import { USER_ROLES } from './auth'

const page = z.coerce.number({ error: 'Pages are numbers.' }).int('Pages are whole numbers.').min(1, 'Pages start at 1.').max(10_000)
const perPage = z.coerce
  .number({ error: 'Rows per page are a number.' })
  .int('Whole rows.')
  .min(5, 'At least 5 per page.')
  .max(100, 'At most 100 per page.')
const words = text().trim().max(120, 'Keep the words under 120 characters.')

export const DESK_STUDIO_STATES = ['waiting', 'verified', 'unverified', 'draft'] as const
export type DeskStudioState = (typeof DESK_STUDIO_STATES)[number]
/** "waiting" puts published studios nobody has verified first; a leading "-" reverses an order. */
export const DESK_STUDIO_SORTS = ['waiting', 'name', '-name', 'created', '-created'] as const
export type DeskStudioSort = (typeof DESK_STUDIO_SORTS)[number]

export const deskStudiosQuerySchema = z.object({
  q: words.optional(),
  state: z.enum(DESK_STUDIO_STATES, { error: 'Choose waiting, verified, unverified or draft.' }).optional(),
  sort: z.enum(DESK_STUDIO_SORTS, { error: 'Sort by name or by when the studio joined.' }).default('waiting'),
  page: page.default(1),
  perPage: perPage.default(20),
})
export type DeskStudiosQuery = z.infer<typeof deskStudiosQuerySchema>

export const DESK_ACCOUNT_STATES = ['active', 'suspended'] as const
export type DeskAccountState = (typeof DESK_ACCOUNT_STATES)[number]
export const DESK_ACCOUNT_SORTS = ['-created', 'created', 'name', '-name'] as const
export type DeskAccountSort = (typeof DESK_ACCOUNT_SORTS)[number]

export const deskAccountsQuerySchema = z.object({
  q: words.optional(),
  role: z.enum(USER_ROLES, { error: 'Choose a kind of account.' }).optional(),
  state: z.enum(DESK_ACCOUNT_STATES, { error: 'Choose active or suspended.' }).optional(),
  sort: z.enum(DESK_ACCOUNT_SORTS, { error: 'Sort by name or by when the account was made.' }).default('-created'),
  page: page.default(1),
  perPage: perPage.default(20),
})
export type DeskAccountsQuery = z.infer<typeof deskAccountsQuerySchema>

export const suspendSchema = z.object({ suspended: z.boolean({ error: 'Say whether to suspend or restore.' }) })
