import { z } from 'zod'
import { text } from './text'

/** Starting or resuming payout onboarding, and asking Stripe again: nothing to send. */
export const payoutActionSchema = z.object({}).strict()

/** Reads of the money page take no query. */
export const payoutQuerySchema = z.object({}).strict()

/** A statement period: a month (2026-05) or a year (2026). */
export const statementPeriodSchema = text().regex(/^\d{4}(-(0[1-9]|1[0-2]))?$/, 'A month as YYYY-MM or a year as YYYY.')

/** The desk settles a dispute, releasing what the studio keeps. */
export const disputeSettleSchema = z.object({ note: text().trim().max(1000, 'Keep the note under 1000 characters.').default('') })
export type DisputeSettleBody = z.infer<typeof disputeSettleSchema>
