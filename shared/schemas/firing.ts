// Schemas for the firing inputs: kilns, firings, pieces, price lists and the ware-check body. The form
// and the route validate with the same ones; what passes is safe to hand to shared/firing/check.ts.

import { z } from 'zod'
import { text } from './text'
import { CLAY_BODIES, COLOURANTS, FIRING_KINDS, GLAZE_SUPPORTS, MATERIALS, PIECE_FORMS, PIECE_STATES } from '../firing/check'
import { compareCones, isCone, parseCone } from '../firing/cones'
import { COOLING_PROFILES } from '../firing/schedule'

// Range checks skip cones that already failed to parse; those carry their own message.
function conesInOrder(minCone: unknown, maxCone: unknown): boolean {
  return !isCone(minCone) || !isCone(maxCone) || compareCones(minCone, maxCone) <= 0
}

/** A cone as people write it ("6", "06", "^6", "cone 04"), read into its canonical form. The examples help generated test input. */
export const coneSchema = text({ error: 'Enter a cone number, like 6 or 04.' })
  .transform((value, ctx) => {
    const parsed = parseCone(value)
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', message: parsed.reason })
      return z.NEVER
    }
    return parsed.cone
  })
  .meta({ examples: ['6', '04', '10', '022', '5'] })

export const atmosphereSchema = z.enum(['oxidation', 'reduction', 'neutral'], {
  error: 'Choose oxidation, reduction or neutral.',
})

function millimetres(what: string, max: number) {
  return z
    .number({ error: `Enter the ${what} in millimetres.` })
    .positive({ error: `The ${what} must be more than 0 mm.` })
    .max(max, { error: `The ${what} can be at most ${max} mm.` })
}

const MAX_KILN_MM = 5000
const MAX_PIECE_MM = 3000

const roundInteriorSchema = z.object({
  shape: z.literal('round'),
  diameterMm: millimetres('inside diameter', MAX_KILN_MM),
  heightMm: millimetres('inside height', MAX_KILN_MM),
})

const boxInteriorSchema = z.object({
  shape: z.literal('box'),
  widthMm: millimetres('inside width', MAX_KILN_MM),
  depthMm: millimetres('inside depth', MAX_KILN_MM),
  heightMm: millimetres('inside height', MAX_KILN_MM),
})

export const kilnInteriorSchema = z.discriminatedUnion('shape', [roundInteriorSchema, boxInteriorSchema], {
  error: 'Say whether the kiln is round or a box.',
})

export const kilnSchema = z
  .object(
    {
      kind: z.enum(['electric', 'gas', 'wood', 'soda', 'salt', 'raku'], { error: 'Choose the kind of kiln.' }),
      atmospheres: z
        .array(atmosphereSchema, { error: 'List the atmospheres the kiln can fire.' })
        .min(1, { error: 'Choose at least one atmosphere the kiln can fire.' })
        .max(3, { error: 'List each atmosphere once.' })
        .refine((atmospheres) => new Set(atmospheres).size === atmospheres.length, { error: 'List each atmosphere once.' }),
      interior: kilnInteriorSchema,
      usableHeightMm: millimetres('usable height', MAX_KILN_MM).optional(),
      minCone: coneSchema,
      maxCone: coneSchema,
      maxTempC: z
        .number({ error: 'Enter the kiln’s top temperature in °C.' })
        .min(100, { error: 'The kiln’s top temperature must be at least 100 °C.' })
        .max(2000, { error: 'The kiln’s top temperature can be at most 2000 °C.' }),
      maxRampCPerHour: z
        .number({ error: 'Enter the fastest the kiln can climb, in °C per hour.' })
        .min(1, { error: 'The fastest climb must be at least 1 °C per hour.' })
        .max(2000, { error: 'The fastest climb can be at most 2000 °C per hour.' }),
      preheatHold: z.boolean({ error: 'Say whether the kiln can hold a low preheat (candling).' }),
      controlledCooling: z.boolean({ error: 'Say whether the kiln can control its cooling.' }),
      // Empty (null from a form) means not said.
      shelfLoadKg: z.preprocess(
        (kg) => (kg === null ? undefined : kg),
        z
          .number({ error: 'Enter what one shelf may carry, in kg.' })
          .positive({ error: 'What one shelf may carry must be more than 0 kg.' })
          .max(1000, { error: 'What one shelf may carry can be at most 1000 kg.' })
          .optional(),
      ),
    },
    { error: 'Describe the kiln: its kind, inside size, cone range and limits.' },
  )
  .refine((kiln) => conesInOrder(kiln.minCone, kiln.maxCone), {
    error: 'The coolest cone must not be hotter than the hottest cone.',
    path: ['maxCone'],
  })
  .refine((kiln) => kiln.usableHeightMm === undefined || kiln.usableHeightMm <= kiln.interior.heightMm, {
    error: 'The usable height cannot be more than the inside height.',
    path: ['usableHeightMm'],
  })

function coneRangeMessage(what: string) {
  return { error: `The ${what}’s coolest cone must not be hotter than its hottest cone.`, path: ['maxCone'] }
}

export const claySchema = z
  .object(
    {
      body: z.enum(CLAY_BODIES, { error: 'Choose the clay body.' }),
      minCone: coneSchema,
      maxCone: coneSchema,
    },
    { error: 'Describe the clay: its body and the cones it fires to.' },
  )
  .refine((clay) => conesInOrder(clay.minCone, clay.maxCone), coneRangeMessage('clay'))

export const glazeSchema = z
  .object(
    {
      minCone: coneSchema,
      maxCone: coneSchema,
      runny: z.boolean().optional(),
      onFoot: z.boolean().optional(),
      support: z.enum(GLAZE_SUPPORTS, { error: 'Say what the piece stands on: nothing, a cookie, a tray or a stilt.' }).optional(),
      colourants: z
        .array(z.enum(COLOURANTS, { error: 'Choose copper, chrome–tin, cobalt or manganese.' }))
        .max(COLOURANTS.length)
        .optional(),
      reductionOnly: z.boolean().optional(),
      tested: z.boolean().optional(),
    },
    { error: 'Describe the glaze: the cones it fires to.' },
  )
  .refine((glaze) => conesInOrder(glaze.minCone, glaze.maxCone), coneRangeMessage('glaze'))

export const firingKindSchema = z.enum(FIRING_KINDS, { error: 'Choose bisque, glaze, single, lustre or raku firing.' })

export const coolingProfileSchema = z.enum(COOLING_PROFILES, {
  error: 'Choose a natural cool, a slow cool through glaze development, or a drop and hold.',
})

export const MAX_PIECE_QUANTITY = 500
export const MAX_PIECES = 200

export const pieceSchema = z
  .object(
    {
      label: text().trim().max(80, { error: 'Keep the label under 80 characters.' }).optional(),
      quantity: z
        .number({ error: 'Enter how many of this piece.' })
        .int({ error: 'Enter a whole number of pieces.' })
        .min(1, { error: 'Bring at least one piece.' })
        .max(MAX_PIECE_QUANTITY, { error: `At most ${MAX_PIECE_QUANTITY} of one piece per ask.` }),
      heightMm: millimetres('height', MAX_PIECE_MM),
      widthMm: millimetres('width', MAX_PIECE_MM),
      depthMm: millimetres('depth', MAX_PIECE_MM),
      round: z.boolean().optional(),
      wallThicknessMm: millimetres('wall thickness', 500),
      form: z.enum(PIECE_FORMS, { error: 'Say whether the piece is open, closed or solid.' }).optional(),
      ventHole: z.boolean().optional(),
      weightG: z
        .number({ error: 'Enter the weight in grams.' })
        .positive({ error: 'The weight must be more than 0 g.' })
        .max(500_000, { error: 'The weight can be at most 500 kg.' })
        .optional(),
      clay: claySchema,
      state: z.enum(PIECE_STATES, { error: 'Say whether the piece is greenware, bisque or glazed.' }),
      boneDry: z.boolean().optional(),
      glaze: glazeSchema.optional(),
      materials: z
        .array(z.enum(MATERIALS, { error: 'Choose glass, metal, combustibles, saggar salts or paper clay.' }))
        .max(MATERIALS.length)
        .optional(),
    },
    { error: 'Describe each piece: its size, wall, clay and state.' },
  )
  .refine((piece) => piece.wallThicknessMm <= Math.max(piece.heightMm, piece.widthMm, piece.depthMm), {
    error: 'The wall cannot be thicker than the piece itself.',
    path: ['wallThicknessMm'],
  })

export const piecesSchema = z
  .array(pieceSchema, { error: 'List the pieces.' })
  .min(1, { error: 'Add at least one piece.' })
  .max(MAX_PIECES, { error: `At most ${MAX_PIECES} different pieces per ask.` })

export const firingSpecSchema = z.object(
  {
    kind: firingKindSchema,
    cone: coneSchema,
    atmosphere: atmosphereSchema,
    cooling: coolingProfileSchema.optional(),
    sharedLoad: z.boolean().optional(),
    slowCool: z.boolean().optional(),
  },
  { error: 'Describe the firing: its kind, cone and atmosphere.' },
)

function cents(what: string) {
  return z
    .number({ error: `Enter the ${what} in cents.` })
    .int({ error: `Enter the ${what} in whole cents.` })
    .min(0, { error: `The ${what} cannot be negative.` })
    .max(100_000_000, { error: `The ${what} can be at most 1 000 000.00.` })
}

function rateCents(what: string) {
  return z
    .number({ error: `Enter the ${what} in cents.` })
    .min(0, { error: `The ${what} cannot be negative.` })
    .max(100_000, { error: `The ${what} can be at most 100 000 cents.` })
}

function percent(what: string, max: number) {
  return z
    .number({ error: `Enter the ${what} as a percent.` })
    .min(0, { error: `The ${what} cannot be negative.` })
    .max(max, { error: `The ${what} can be at most ${max} %.` })
}

export const priceListSchema = z
  .object(
    {
      currency: text({ error: 'Enter the currency, like USD.' })
        .trim()
        .toUpperCase()
        .regex(/^[A-Z]{3}$/, { error: 'Enter the currency as a three-letter code, like USD or EUR.' }),
      model: z.enum(['volume', 'shelf', 'layer', 'kiln'], { error: 'Choose pricing by volume, by shelf, by layer or by whole kiln.' }),
      centsPerCubicInch: rateCents('price per cubic inch').optional(),
      centsPerLitre: rateCents('price per litre').optional(),
      shelfCents: cents('shelf price').optional(),
      shelfStep: z
        .number({ error: 'Enter the shelf step as a fraction, like 0.25 for a quarter shelf.' })
        .min(0.01, { error: 'The shelf step must be at least 0.01 of a shelf.' })
        .max(1, { error: 'The shelf step can be at most one whole shelf.' })
        .optional(),
      shelfAreaMm2: z.number().positive({ error: 'The shelf area must be more than 0.' }).optional(),
      layerCents: cents('layer price').optional(),
      kilnCents: cents('whole-kiln price').optional(),
      minimumPerPieceCents: cents('minimum per piece').optional(),
      surcharges: z
        .object(
          {
            reduction: percent('reduction surcharge', 500).optional(),
            slowCool: percent('slow-cool surcharge', 500).optional(),
            preheat: percent('preheat surcharge', 500).optional(),
          },
          { error: 'Give surcharges as percents.' },
        )
        .optional(),
      deposit: z.union([z.object({ percent: percent('deposit', 100) }), z.object({ fixedCents: cents('deposit') })], {
        error: 'Give the deposit as a percent or as a fixed sum in cents.',
      }),
    },
    { error: 'Describe the price list: currency, pricing model and deposit.' },
  )
  .superRefine((priceList, ctx) => {
    if (priceList.model === 'volume') {
      const given = Number(priceList.centsPerCubicInch !== undefined) + Number(priceList.centsPerLitre !== undefined)
      if (given !== 1) {
        ctx.addIssue({
          code: 'custom',
          path: ['centsPerCubicInch'],
          message: 'For volume pricing give one price: per cubic inch or per litre.',
        })
      }
    } else if (priceList.model === 'shelf' && priceList.shelfCents === undefined) {
      ctx.addIssue({ code: 'custom', path: ['shelfCents'], message: 'For shelf pricing give the price of a whole shelf.' })
    } else if (priceList.model === 'layer' && priceList.layerCents === undefined) {
      ctx.addIssue({ code: 'custom', path: ['layerCents'], message: 'For layer pricing give the price of a whole layer.' })
    } else if (priceList.model === 'kiln' && priceList.kilnCents === undefined) {
      ctx.addIssue({ code: 'custom', path: ['kilnCents'], message: 'For whole-kiln pricing give the price of the kiln.' })
    }
  })

const BODY_SHAPE = 'Send {kiln, firing, pieces} (with an optional priceList), or {firingId, pieces}.'

export const wareCheckInlineSchema = z.strictObject(
  {
    kiln: kilnSchema,
    firing: firingSpecSchema,
    pieces: piecesSchema,
    priceList: priceListSchema.optional(),
  },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `Unexpected field: ${issue.keys.join(', ')}. ${BODY_SHAPE}` : BODY_SHAPE) },
)

export const wareCheckByFiringSchema = z.strictObject(
  {
    firingId: text({ error: 'Give the firing’s id.' }).trim().min(1, { error: 'Give the firing’s id.' }).max(100),
    pieces: piecesSchema,
  },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? `Unexpected field: ${issue.keys.join(', ')}. ${BODY_SHAPE}` : BODY_SHAPE) },
)

export type WareCheckInlineBody = z.output<typeof wareCheckInlineSchema>
export type WareCheckByFiringBody = z.output<typeof wareCheckByFiringSchema>
export type WareCheckBody = WareCheckInlineBody | WareCheckByFiringBody

/**
 * `{kiln, firing, pieces, priceList?}` or `{firingId, pieces}`. The shape is chosen by the presence of
 * firingId so that errors name the fields of the shape meant, not a bare "invalid input".
 */
export const wareCheckBodySchema = z
  .unknown()
  .transform((body, ctx): WareCheckBody => {
    const byFiring = typeof body === 'object' && body !== null && 'firingId' in body
    const parsed = byFiring ? wareCheckByFiringSchema.safeParse(body) : wareCheckInlineSchema.safeParse(body)
    if (parsed.success) return parsed.data
    for (const issue of parsed.error.issues) {
      ctx.addIssue({ code: 'custom', message: issue.message, path: [...issue.path] as (string | number)[] })
    }
    return z.NEVER
  })
  // Says which shapes the body takes, for tools that generate input from schemas (the fuzz suite).
  .meta({ oneOf: [wareCheckInlineSchema, wareCheckByFiringSchema] })

export type KilnInput = z.input<typeof kilnSchema>
export type PieceInput = z.input<typeof pieceSchema>
export type FiringSpecInput = z.input<typeof firingSpecSchema>
export type PriceListInput = z.input<typeof priceListSchema>
