// Bodies of the piece and load routes: the studio's drop-off checklist, a piece tagged at drop-off,
// a piece held back, a piece's result, and the crew's load plan. Forms and routes use the same ones.
import { z } from 'zod'
import type { Piece } from '../firing/check'
import { POST_HEIGHTS_MM } from '../firing/load'
import { PIECE_OUTCOMES } from './pickup'
import { text } from './text'

/** Which pieces a checklist item asks about: every one, or only those the request declares so. */
export const CHECK_APPLIES_TO = ['all', 'greenware', 'glazed', 'closed-form', 'runny-glaze'] as const
export type CheckAppliesTo = (typeof CHECK_APPLIES_TO)[number]

export const checklistItemSchema = z.object({
  id: text({ error: 'Give the item a short id.' }).regex(
    /^[a-z0-9][a-z0-9-]{1,39}$/,
    'Ids are 2–40 lower-case letters, digits and dashes.',
  ),
  label: text({ error: 'Say what the crew checks.' }).trim().min(3, 'Say what the crew checks.').max(120, 'Keep it under 120 characters.'),
  appliesTo: z.enum(CHECK_APPLIES_TO, { error: 'Choose which pieces it applies to.' }).default('all'),
})
export type ChecklistItem = z.output<typeof checklistItemSchema>

export const checklistSchema = z.object({
  items: z
    .array(checklistItemSchema)
    .max(20, 'Keep the checklist to 20 items, so crew can tick it on a phone.')
    .refine((items) => new Set(items.map((i) => i.id)).size === items.length, 'Each item needs its own id.'),
})
export type ChecklistBody = z.output<typeof checklistSchema>

/** A studio's checklist until it writes its own: what a shared load asks of every piece (common practice). */
export const DEFAULT_CHECKLIST: ChecklistItem[] = [
  { id: 'bone-dry', label: 'Bone dry: cool to the cheek, one even colour, no damp patches', appliesTo: 'greenware' },
  { id: 'sound', label: 'No cracks; handles, knobs and joins sound', appliesTo: 'all' },
  { id: 'clean-foot', label: 'Foot clean: glaze stops at least ¼ in (6 mm) above it', appliesTo: 'glazed' },
  { id: 'vent-hole', label: 'Closed form has a vent hole', appliesTo: 'closed-form' },
  { id: 'cookie', label: 'Runny glaze stands on a cookie or tray', appliesTo: 'runny-glaze' },
]

/** Whether a checklist item asks about a piece of this declared line. */
export function itemApplies(item: Pick<ChecklistItem, 'appliesTo'>, line: Piece): boolean {
  switch (item.appliesTo) {
    case 'greenware':
      return line.state === 'greenware'
    case 'glazed':
      return line.glaze !== undefined || line.state === 'glazed'
    case 'closed-form':
      return line.form === 'closed'
    case 'runny-glaze':
      return line.glaze?.runny === true
    default:
      return true
  }
}

const mm = (what: string) =>
  z
    .number({ error: `Enter the measured ${what}.` })
    .positive(`The ${what} must be more than 0.`)
    .max(3000)

const photoIds = z.array(z.uuid({ error: 'Photos are named by their ids.' })).max(8, 'At most 8 photos.')
const reason = text({ error: 'Say why.' }).trim().min(3, 'Say why the piece is held back.').max(1000)

/** One piece as the crew takes it in at drop-off: every item ticked or failed, its size if it differs, its weight. */
export const pieceTagSchema = z.object({
  pieceIndex: z.number({ error: 'Say which of the declared pieces this is.' }).int().min(0).max(199),
  checks: z.record(text().max(40), z.boolean(), { error: 'Tick or fail each item.' }).default({}),
  measured: z.object({ heightMm: mm('height'), widthMm: mm('width'), depthMm: mm('depth') }).optional(),
  weightG: z.number({ error: 'Enter the weight in grams.' }).positive('The weight must be more than 0 g.').max(500_000).optional(),
  /** Why it is held back, when an item failed; the failed items are named when this is left out. */
  holdReason: reason.optional(),
  photoIds: photoIds.optional(),
})
export type PieceTagBody = z.output<typeof pieceTagSchema>

export const pieceHoldSchema = z.object({ reason, photoIds: photoIds.optional() })

export const pieceResultSchema = z.object({
  outcome: z.enum(PIECE_OUTCOMES, { error: 'Say how the piece came out.' }),
  notes: text().trim().max(1000).optional(),
  photoIds: photoIds.optional(),
})
export type PieceResultBody = z.output<typeof pieceResultSchema>

/** A piece's key in a load: its request, the declared line and which one of that line. */
export const LOAD_KEY = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}:\d{1,3}:\d{1,3}$/

export const placementSchema = z.object({
  key: text().regex(LOAD_KEY, 'Not a piece of this load.'),
  layer: z.number().int().min(0).max(60),
  shelf: z.number().int().min(0).max(60),
  x: z.number().min(-5000).max(5000),
  y: z.number().min(-5000).max(5000),
  rotation: z.union([z.literal(0), z.literal(90)], { error: 'Turn a piece by 0 or 90 degrees.' }),
})

/** The crew's plan: where each piece they placed stands; every other piece is planned around them. */
export const loadPlanSchema = z.object({
  placements: z
    .array(placementSchema)
    .max(3000)
    .refine((list) => new Set(list.map((p) => p.key)).size === list.length, 'Each piece is placed once.'),
})
export type LoadPlanBody = z.output<typeof loadPlanSchema>

/** What a studio says about a kiln's furniture (shared/firing/load.ts KilnFurniture). */
export const kilnFurnitureSchema = z.object({
  halfShelves: z.boolean().optional(),
  postHeightsMm: z
    .array(z.number().positive('A post is taller than 0.').max(1000))
    .min(1, 'List at least one post size.')
    .max(20)
    .optional(),
  glazedGapMm: z.number().min(0, 'The gap cannot be negative.').max(200).optional(),
  bisqueGapMm: z.number().min(0, 'The gap cannot be negative.').max(200).optional(),
  headClearanceMm: z.number().min(0, 'The clearance cannot be negative.').max(200).optional(),
  shelfThicknessMm: z.number().positive('A shelf is thicker than 0.').max(100).optional(),
})

export { POST_HEIGHTS_MM }
