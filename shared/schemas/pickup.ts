// Bodies of the drop-off-to-pickup routes: check-in, the firing log, results, balance, the answers after pickup.
import { z } from 'zod'
import { CONE_BENDS } from '../firing/witness'
import { text } from './text'
import { ANSWERS } from '../reviews'
import { coneSchema } from './firing'

const mm = (what: string) =>
  z
    .number({ error: `Enter the measured ${what}.` })
    .positive(`The ${what} must be more than 0.`)
    .max(3000)
const instant = z.iso.datetime({ offset: true, error: 'Enter a date and time.' })

export const checkInSchema = z
  .object({
    pieces: z
      .array(
        z.object({
          pieceIndex: z.number().int().min(0),
          received: z.number({ error: 'Enter how many came in.' }).int('Count whole pieces.').min(0).max(500),
          measured: z.object({ heightMm: mm('height'), widthMm: mm('width'), depthMm: mm('depth') }).optional(),
        }),
      )
      .max(200),
    conditionNotes: text().trim().max(4000).optional(),
    refuse: z.object({ reason: text().trim().min(3, 'Say why the ware is refused.').max(1000) }).optional(),
  })
  .refine((b) => b.refuse || b.pieces.some((p) => p.received > 0), {
    message: 'Record the pieces received, or refuse the ware with a reason.',
    path: ['pieces'],
  })

export { CONE_BENDS }

/** Readings a log keeps: a controller's export at one a minute covers over three days. */
export const MAX_READINGS = 5000

export const readingSchema = z.object({
  at: instant,
  tempC: z
    .number({ error: 'Enter the temperature in °C.' })
    .min(-50, 'A reading below −50 °C is not a kiln temperature.')
    .max(2000, 'A reading above 2000 °C is not a kiln temperature.'),
})

export const firingLogSchema = z.object({
  loadedAt: instant.nullable().optional(),
  startedAt: instant.nullable().optional(),
  peakC: z.number().min(0).max(2000).nullable().optional(),
  finalRateCPerHour: z.number().positive().max(2000).nullable().optional(),
  holdMinutes: z.number().min(0).max(10_000).nullable().optional(),
  offAt: instant.nullable().optional(),
  openedAt: instant.nullable().optional(),
  witnessCones: z
    .array(
      z.object({
        cone: coneSchema,
        bend: z.enum(CONE_BENDS, { error: 'Say how far the cone bent.' }),
        position: text().trim().max(80).optional(),
      }),
    )
    .max(60)
    .default([]),
  readings: z.array(readingSchema).max(MAX_READINGS, `At most ${MAX_READINGS} readings; keep one a minute or fewer.`).default([]),
  notes: text().trim().max(4000).optional(),
})
export type FiringLogBody = z.infer<typeof firingLogSchema>

/** How a piece came out of the kiln. */
export const PIECE_OUTCOMES = [
  'fine',
  'cracked',
  'dunted',
  'blown-out',
  'bloated',
  'glaze-ran',
  'stuck-to-shelf',
  'crawled',
  'pinholed',
  'underfired',
  'crazed',
  'other',
] as const
export type PieceOutcome = (typeof PIECE_OUTCOMES)[number]

const outcome = z.enum(PIECE_OUTCOMES, { error: 'Say how the piece came out.' })
const outcomeNotes = text().trim().max(1000).optional()

/**
 * The results for a request: per piece by its tag, or one outcome for every piece of a declared line
 * (a line of mugs that all came out fine). Every piece in the load ends up with an outcome.
 */
export const resultsSchema = z
  .object({
    outcomes: z
      .array(z.object({ pieceIndex: z.number().int().min(0), outcome, notes: outcomeNotes }))
      .max(200)
      .optional(),
    pieces: z
      .array(z.object({ tag: text().trim().min(8).max(12), outcome, notes: outcomeNotes }))
      .max(5000)
      .optional(),
    notes: text().trim().max(4000).optional(),
  })
  .refine((b) => (b.outcomes?.length ?? 0) + (b.pieces?.length ?? 0) > 0, {
    message: 'Give each piece how it came out.',
    path: ['pieces'],
  })

const answer = z.enum(ANSWERS, { error: 'Choose yes, partly or no.' })

/**
 * One side's answers after pickup. Every question is optional here because the server decides the side
 * from who is asking; `unanswered` (shared/reviews) then names the questions that side left open.
 */
export const reviewSchema = z.object({
  loading: answer.optional(),
  resultsAsLogged: answer.optional(),
  turnaround: answer.optional(),
  communication: answer.optional(),
  fireAgain: z.boolean({ error: 'Say whether you would fire here again.' }).optional(),
  asDeclared: answer.optional(),
  cleanAndDry: answer.optional(),
  onTime: answer.optional(),
  note: text().trim().max(2000, 'Keep it under 2000 characters.').default(''),
})

export const counterPaymentSchema = z.object({
  amountCents: z.number().int('Whole cents.').positive('Enter what was paid.').max(100_000_000).optional(),
  note: text().trim().max(300).optional(),
})

export const photoPatchSchema = z.object({ public: z.boolean() })
