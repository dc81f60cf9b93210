import { z } from 'zod'
import { text } from './text'

/**
 * Stored and API role values. `host` is the stored value for a studio owner (kept so the API and the
 * data stay as they are); people only ever read ROLE_LABELS.
 */
export const USER_ROLES = ['potter', 'host', 'crew', 'admin'] as const
export type UserRole = (typeof USER_ROLES)[number]

/** The roles as people read them. */
export const ROLE_LABELS: Record<UserRole, string> = {
  potter: 'Potter',
  host: 'Studio owner',
  crew: 'Studio crew',
  admin: 'Conewright desk',
}
export type UnitSystem = 'imperial' | 'metric'

/** What the API says about the signed-in person. */
export interface PublicUser {
  id: string
  email: string
  displayName: string
  role: UserRole
  emailVerified: boolean
  unitSystem: UnitSystem
  /** The studios this person owns or crews for. */
  studios?: { id: string; name: string; role: 'owner' | 'crew' }[]
}

const email = text({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }))

// Length only: the server also scores strength, which needs a dictionary too big for every page.
const newPassword = text({ error: 'Choose a password.' }).min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.')

export const registerSchema = z.object({
  email,
  password: newPassword,
  displayName: text({ error: 'Enter the name others will see.' })
    .trim()
    .min(1, 'Enter the name others will see.')
    .max(80, 'Keep the name under 80 characters.'),
  role: z.enum(['potter', 'host'], { error: 'Choose whether you bring ware (potter) or fire it (studio).' }),
  inviteToken: text().min(10).max(200).optional(),
})
export type RegisterBody = z.infer<typeof registerSchema>

export const loginSchema = z.object({
  email,
  password: text({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(200),
})
export type LoginBody = z.infer<typeof loginSchema>

export const passwordResetRequestSchema = z.object({ email })

const token = text({ error: 'The link is missing its token.' }).min(10, 'That link is not valid.').max(200)

export const passwordResetConfirmSchema = z.object({ token, password: newPassword })

export const verifyEmailSchema = z.object({ token })

export const signInLinkRequestSchema = z.object({ email })

export const signInLinkConfirmSchema = z.object({ token })

export const preferencesSchema = z.object({
  unitSystem: z.enum(['imperial', 'metric']).optional(),
  displayName: text().trim().min(1).max(80).optional(),
})
