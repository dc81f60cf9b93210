// Bodies of the studio, kiln, price list and firing routes. The editors use the same schemas.
import { z } from 'zod'
import { text } from './text'
import { coneSchema, atmosphereSchema, coolingProfileSchema, firingKindSchema, kilnSchema, priceListSchema } from './firing'
import { FIRING_STATUSES } from '../workflow/firing-status'
import { SEGMENT_ZONES } from '../firing/schedule'
import { kilnFurnitureSchema } from './pieces'
import { DAMAGE_CHARGE_KINDS, type DamageChargeKind } from '../claims'

export const CLAY_BODIES = ['earthenware', 'stoneware', 'porcelain', 'other'] as const

export function isTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone })
    return true
  } catch {
    return false
  }
}

const longText = (max: number, what: string) =>
  text({ error: `Enter the ${what}.` })
    .trim()
    .max(max, `Keep the ${what} under ${max} characters.`)

export const studioPoliciesSchema = z.object({
  clayBodies: z
    .array(z.enum(CLAY_BODIES, { error: 'Choose from earthenware, stoneware, porcelain and other.' }))
    .min(1, 'Accept at least one clay body.')
    .max(4)
    .refine((bodies) => new Set(bodies).size === bodies.length, 'List each clay body once.'),
  wareRequirements: longText(2000, 'ware requirements'),
  cancellation: z.object({
    fullRefundDaysBefore: z
      .number({ error: 'Enter a number of days.' })
      .int('Enter whole days.')
      .min(0, 'Days cannot be negative.')
      .max(90, 'At most 90 days.'),
    laterRefundPercent: z.number({ error: 'Enter a percent.' }).min(0, 'At least 0 %.').max(100, 'At most 100 %.'),
  }),
  /** How long an accepted request may wait for its deposit before its space is released. */
  depositHoldHours: z
    .number({ error: 'Enter a number of hours.' })
    .int('Enter whole hours.')
    .min(1, 'At least 1 hour.')
    .max(336, 'At most 14 days.'),
  /** The most the studio charges when a potter's ware damages the kiln, shelves or other ware (shared/claims.ts). */
  damageCharges: z
    .object(
      Object.fromEntries(
        DAMAGE_CHARGE_KINDS.map((kind) => [
          kind,
          z.number({ error: 'Enter an amount.' }).int('Enter whole cents.').min(0, 'At least 0.').max(1_000_000, 'At most 10,000.'),
        ]),
      ) as Record<DamageChargeKind, z.ZodNumber>,
    )
    .optional(),
})
export type StudioPolicies = z.infer<typeof studioPoliciesSchema>

export const DEFAULT_POLICIES: StudioPolicies = {
  clayBodies: ['stoneware', 'porcelain'],
  wareRequirements: 'Bone dry or bisqued; no glaze within 1/4 inch of the foot; runny glazes on a cookie.',
  cancellation: { fullRefundDaysBefore: 7, laterRefundPercent: 50 },
  depositHoldHours: 48,
}

const name = text({ error: 'Enter the studio’s name.' })
  .trim()
  .min(2, 'Enter the studio’s name.')
  .max(120, 'Keep the name under 120 characters.')
const postalCode = text()
  .trim()
  .min(3, 'Enter a postal or ZIP code.')
  .max(12, 'That postal code is too long.')
  .meta({ examples: ['97214', '98101', 'V6B'] })
const address = text()
  .trim()
  .min(5, 'Enter the street address with its town or ZIP code.')
  .max(300, 'That address is too long.')
  .meta({ examples: ['1200 SE Morrison St, Portland, OR 97214'] })

export const studioCreateSchema = z
  .object({ name, postalCode: postalCode.optional(), address: address.optional() })
  .refine((s) => s.postalCode || s.address, { message: 'Enter a postal code or an address so potters can find you.', path: ['postalCode'] })
export type StudioCreateBody = z.infer<typeof studioCreateSchema>

export const studioPatchSchema = z
  .object({
    name,
    description: longText(4000, 'description'),
    address: address.nullable(),
    postalCode,
    lat: z.number().min(-90).max(90),
    lng: z.number().min(-180).max(180),
    timezone: text()
      .refine(isTimeZone, 'Choose a time zone from the list.')
      .meta({ examples: ['America/Los_Angeles', 'America/Vancouver'] }),
    currency: text()
      .trim()
      .toUpperCase()
      .regex(/^[A-Z]{3}$/, 'Use a three-letter currency code, like USD.'),
    dropOffHours: longText(300, 'drop-off hours'),
    policies: studioPoliciesSchema,
    published: z.boolean(),
  })
  .partial()
  .refine((s) => (s.lat === undefined) === (s.lng === undefined), {
    message: 'Move the pin to set both latitude and longitude.',
    path: ['lat'],
  })
export type StudioPatchBody = z.infer<typeof studioPatchSchema>

const kilnExtras = z.object({
  name: text({ error: 'Name the kiln.' }).trim().min(1, 'Name the kiln.').max(80, 'Keep the name under 80 characters.'),
  shelfCount: z.number({ error: 'Enter how many shelves.' }).int('Enter a whole number of shelves.').min(0).max(60),
  shelfWidthMm: z.number().positive('The shelf size must be more than 0.').max(5000).nullable().optional(),
  shelfDepthMm: z.number().positive('The shelf size must be more than 0.').max(5000).nullable().optional(),
  /** Half shelves, posts, gaps and clearances for the load planner; null for the usual ones. */
  furniture: kilnFurnitureSchema.nullable().optional(),
  notes: longText(2000, 'notes').optional(),
})

/** A kiln record: its limits (the Kiln of shared/firing/check.ts) and what a studio adds. */
export const kilnBodySchema = z.intersection(kilnExtras, kilnSchema)
export type KilnBody = z.infer<typeof kilnBodySchema>

/** Any subset; the server merges it with the stored kiln and checks the whole again. */
export const kilnPatchSchema = z.record(text(), z.unknown())

export const priceListBodySchema = priceListSchema
export type PriceListBody = z.infer<typeof priceListBodySchema>

const instant = (what: string) => z.iso.datetime({ offset: true, error: `Enter the ${what} as a date and time.` })

const segmentSchema = z.object({
  fromC: z.number().min(-50).max(2000),
  toC: z.number().min(-50).max(2000),
  rateCPerHour: z.number().positive().max(5000),
  holdMinutes: z.number().min(0).max(10_000),
  zone: z.enum(SEGMENT_ZONES),
})

const firingFields = {
  kind: firingKindSchema,
  cone: coneSchema,
  atmosphere: atmosphereSchema,
  slowCool: z.boolean().optional(),
  cooling: coolingProfileSchema.optional(),
  dropOffBy: instant('drop-off deadline'),
  firingDate: instant('firing date'),
  readyBy: instant('ready-by date'),
  /** Layers of the kiln on sale in this firing; every layer when left empty. */
  layersOnSale: z
    .number({ error: 'Enter how many layers are on sale.' })
    .int('Enter whole layers.')
    .min(1, 'Put at least one layer on sale.')
    .max(60, 'At most 60 layers.')
    .nullable()
    .optional(),
  notes: longText(2000, 'notes').optional(),
  schedule: z.array(segmentSchema).max(60).nullable().optional(),
}

function datesInOrder(f: { dropOffBy?: string; firingDate?: string; readyBy?: string }, ctx: z.RefinementCtx) {
  const t = (s?: string) => (s ? Date.parse(s) : undefined)
  const [drop, fire, ready] = [t(f.dropOffBy), t(f.firingDate), t(f.readyBy)]
  if (drop !== undefined && fire !== undefined && drop > fire)
    ctx.addIssue({ code: 'custom', path: ['dropOffBy'], message: 'Drop-off must close before the firing starts.' })
  if (fire !== undefined && ready !== undefined && fire > ready)
    ctx.addIssue({ code: 'custom', path: ['readyBy'], message: 'Ware can be ready only after the firing.' })
}

export const firingCreateSchema = z
  .object({
    ...firingFields,
    repeat: z
      .object({
        everyWeeks: z.number().int().min(1, 'Repeat at least every week.').max(8, 'Repeat at most every 8 weeks.'),
        times: z.number().int().min(2, 'A repeat makes at least 2 firings.').max(26, 'At most 26 firings at once.'),
      })
      .optional(),
  })
  .superRefine(datesInOrder)
export type FiringCreateBody = z.infer<typeof firingCreateSchema>

export const firingPatchSchema = z
  .strictObject({ ...firingFields })
  .partial()
  .superRefine(datesInOrder)
export type FiringPatchBody = z.infer<typeof firingPatchSchema>

/** A stage move; `confirm` answers the question the server asked (a date ahead, requests that lapse). */
export const firingMoveSchema = z.object({
  status: z.enum(FIRING_STATUSES, { error: 'Unknown firing status.' }),
  confirm: z.boolean().optional(),
})
export type FiringMoveBody = z.infer<typeof firingMoveSchema>

export const firingCancelSchema = z.object({
  reason: text({ error: 'Say why the firing is cancelled; potters holding space will read it.' })
    .trim()
    .min(3, 'Say why the firing is cancelled.')
    .max(500),
})

export const crewInviteSchema = z.object({
  email: text()
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
})

export const inviteAcceptSchema = z.object({ token: text().min(10).max(200) })
