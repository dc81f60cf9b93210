// Bodies of the incident and claim routes; the report form and the claim form use the same schemas.
import { z } from 'zod'
import { CRACK_EDGES, INCIDENT_KINDS } from '../firing/incidents'
import { DAMAGE_CHARGE_KINDS } from '../claims'
import { REMEDY_KINDS } from '../remedies'
import { text } from './text'

const tag = text()
  .trim()
  .min(4, 'Enter the piece’s tag as printed on its label.')
  .max(12, 'That tag is too long.')
  .meta({ examples: ['K7M2-X4HR'] })

const note = (max: number) =>
  text()
    .trim()
    .max(max, `Keep it under ${max} characters.`)
    .meta({ examples: ['Shards across the middle shelf.'] })

export const incidentBodySchema = z.object({
  kind: z.enum(INCIDENT_KINDS, { error: 'Say what happened.' }),
  crackEdge: z.enum(CRACK_EDGES, { error: 'Say how the crack’s edge looks.' }).optional(),
  shards: z.boolean().default(false),
  neighboursHit: z.boolean().default(false),
  shelfDamage: z.boolean().default(false),
  elementDamage: z.boolean().default(false),
  whereInKiln: note(200).default(''),
  note: note(2000).default(''),
  /** The pieces that failed, by tag: they name the potter whose ware it was. */
  pieceTags: z.array(tag).max(50, 'At most 50 pieces.').default([]),
  /** Other people's pieces hurt by it, by tag: their potters are told. */
  hurtTags: z.array(tag).max(100, 'At most 100 pieces.').default([]),
  /** The ask the ware came in with, when no tag is given (a potter reporting on their own ask). */
  requestId: z.uuid({ error: 'Choose the ask.' }).optional(),
})
export type IncidentBody = z.infer<typeof incidentBodySchema>

export const claimBodySchema = z.object({
  chargeKind: z.enum(DAMAGE_CHARGE_KINDS, { error: 'Choose what the charge is for.' }),
  amountCents: z
    .number({ error: 'Enter an amount.' })
    .int('Enter whole cents.')
    .positive('Enter an amount above zero.')
    .max(10_000_000, 'That amount is too large.'),
  note: note(2000).default(''),
})
export type ClaimBody = z.infer<typeof claimBodySchema>

export const claimContestSchema = z.object({
  reason: text({ error: 'Say why you contest the claim.' })
    .trim()
    .min(5, 'Say why you contest the claim.')
    .max(2000, 'Keep it under 2000 characters.')
    .meta({ examples: ['The piece was bone dry; the log shows the kiln climbed at 400 °C/h.'] }),
})
export type ClaimContestBody = z.infer<typeof claimContestSchema>

export const claimPaySchema = z.object({
  /** On a checkout page (the default), or with the card kept at the deposit. */
  with: z.enum(['checkout', 'kept-card'], { error: 'Pay on a checkout page or with the kept card.' }).default('checkout'),
})
export type ClaimPayBody = z.infer<typeof claimPaySchema>

export const claimDecisionSchema = z.object({
  decision: z.enum(['uphold', 'waive'], { error: 'Uphold or waive the claim.' }),
  note: note(2000).default(''),
})
export type ClaimDecisionBody = z.infer<typeof claimDecisionSchema>

/**
 * The studio makes good to one potter whose pieces the incident hurt, on that potter's own ask: a
 * credit of an amount, or a free refire of named pieces (in a coming firing it may name).
 */
export const remedyBodySchema = z
  .object({
    requestId: z.uuid({ error: 'Choose whose ask it is.' }),
    kind: z.enum(REMEDY_KINDS, { error: 'Choose a credit or a free refire.' }),
    amountCents: z
      .number({ error: 'Enter an amount.' })
      .int('Enter whole cents.')
      .positive('Enter an amount above zero.')
      .max(10_000_000, 'That amount is too large.')
      .optional(),
    tags: z.array(tag).max(100, 'At most 100 pieces.').default([]),
    firingId: z.uuid({ error: 'Choose one of your coming firings.' }).optional(),
    note: note(2000).default(''),
  })
  .superRefine((body, check) => {
    if (body.kind === 'credit' && body.amountCents === undefined)
      check.addIssue({ code: 'custom', path: ['amountCents'], message: 'Enter the amount to give back.' })
    if (body.kind === 'refire' && !body.tags.length)
      check.addIssue({ code: 'custom', path: ['tags'], message: 'Choose the pieces to refire.' })
  })
export type RemedyBody = z.infer<typeof remedyBodySchema>
