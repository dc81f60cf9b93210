// The planner form's values, kept in SI (mm, °C, °C/h, cents) as the firing science takes them, and
// read through the shared schemas on every change: what parses is checked, what does not gets the
// schema's own message beside its field.

import { z } from 'zod'
import type { Atmosphere, CoolingProfile, Firing, FiringKind, Kiln, KilnKind, Piece } from '../../../shared/firing/check'
import type { PriceList, PricingModel } from '../../../shared/firing/quote'
import { firingSpecSchema, kilnSchema, piecesSchema, priceListSchema } from '../../../shared/schemas/firing'
import { newPiece, pieceInputOf, type NumberDraft, type PieceDraft } from '../../lib/pieceDraft'
import { collectMessages, type FieldMessages } from '../../lib/schemaMessages'
import type { UnitSystem } from '../../lib/units'
import { DEMO_KILNS } from './demoKilns'

export interface KilnDraft {
  kind: KilnKind
  atmospheres: Atmosphere[]
  interior: { shape: 'round' | 'box'; diameterMm: NumberDraft; widthMm: NumberDraft; depthMm: NumberDraft; heightMm: NumberDraft }
  usableHeightMm: NumberDraft
  minCone: string
  maxCone: string
  maxTempC: NumberDraft
  maxRampCPerHour: NumberDraft
  preheatHold: boolean
  controlledCooling: boolean
  shelfLoadKg: NumberDraft
}

export interface FiringDraft {
  kind: FiringKind
  cone: string
  atmosphere: Atmosphere
  slowCool: boolean
  cooling: CoolingProfile
  /** Other people's ware in the load (a shared firing); off: the kiln to oneself. */
  sharedLoad: boolean
}

export interface PriceListDraft {
  currency: string
  model: PricingModel
  volumeUnit: 'cubicInch' | 'litre'
  centsPerCubicInch: NumberDraft
  centsPerLitre: NumberDraft
  shelfCents: NumberDraft
  shelfStep: number
  kilnCents: NumberDraft
  minimumPerPieceCents: NumberDraft
  surcharges: { reduction: NumberDraft; slowCool: NumberDraft; preheat: NumberDraft }
  depositKind: 'percent' | 'fixed'
  deposit: { percent: NumberDraft; fixedCents: NumberDraft }
}

export interface PlannerValues {
  demoKilnId: string
  kiln: KilnDraft
  firing: FiringDraft
  pieces: PieceDraft[]
  quoteOn: boolean
  priceList: PriceListDraft
}

export function kilnDraftOf(kiln: Kiln): KilnDraft {
  const interior = kiln.interior
  return {
    kind: kiln.kind,
    atmospheres: [...kiln.atmospheres],
    interior:
      interior.shape === 'round'
        ? { shape: 'round', diameterMm: interior.diameterMm, widthMm: undefined, depthMm: undefined, heightMm: interior.heightMm }
        : { shape: 'box', diameterMm: undefined, widthMm: interior.widthMm, depthMm: interior.depthMm, heightMm: interior.heightMm },
    usableHeightMm: kiln.usableHeightMm,
    minCone: kiln.minCone,
    maxCone: kiln.maxCone,
    maxTempC: kiln.maxTempC,
    maxRampCPerHour: kiln.maxRampCPerHour,
    preheatHold: kiln.preheatHold,
    controlledCooling: kiln.controlledCooling,
    shelfLoadKg: kiln.shelfLoadKg,
  }
}

export function plannerDefaults(): PlannerValues {
  const demo = DEMO_KILNS[0]
  return {
    demoKilnId: demo.id,
    kiln: kilnDraftOf(demo.kiln),
    firing: { kind: 'glaze', cone: '6', atmosphere: 'oxidation', slowCool: false, cooling: 'natural', sharedLoad: true },
    pieces: [{ ...newPiece(), label: 'Mug', quantity: 4 }],
    quoteOn: false,
    // An example community-studio rate, not advice: 4 ¢ per cubic inch, half down.
    priceList: {
      currency: 'USD',
      model: 'volume',
      volumeUnit: 'cubicInch',
      centsPerCubicInch: 4,
      centsPerLitre: 250,
      shelfCents: 4000,
      shelfStep: 0.25,
      kilnCents: 25000,
      minimumPerPieceCents: 300,
      surcharges: { reduction: 15, slowCool: 10, preheat: 10 },
      depositKind: 'percent',
      deposit: { percent: 50, fixedCents: 1000 },
    },
  }
}

/** The form's kiln, firing and pieces in the shape the shared schemas read. */
export function checkInputOf(values: PlannerValues) {
  const { kiln, firing } = values
  const interior = kiln.interior
  return {
    kiln: {
      kind: kiln.kind,
      atmospheres: kiln.atmospheres,
      interior:
        interior.shape === 'round'
          ? { shape: 'round', diameterMm: interior.diameterMm, heightMm: interior.heightMm }
          : { shape: 'box', widthMm: interior.widthMm, depthMm: interior.depthMm, heightMm: interior.heightMm },
      usableHeightMm: kiln.usableHeightMm,
      minCone: kiln.minCone,
      maxCone: kiln.maxCone,
      maxTempC: kiln.maxTempC,
      maxRampCPerHour: kiln.maxRampCPerHour,
      preheatHold: kiln.preheatHold,
      controlledCooling: kiln.controlledCooling,
      shelfLoadKg: kiln.shelfLoadKg,
    },
    firing: {
      kind: firing.kind,
      cone: firing.cone,
      atmosphere: firing.atmosphere,
      slowCool: firing.slowCool,
      cooling: firing.cooling,
      sharedLoad: firing.sharedLoad,
    },
    pieces: values.pieces.map(pieceInputOf),
  }
}

/** The price list in the schema's shape: only the fields its pricing model uses. */
export function priceListInputOf(draft: PriceListDraft) {
  const byModel =
    draft.model === 'volume'
      ? draft.volumeUnit === 'cubicInch'
        ? { centsPerCubicInch: draft.centsPerCubicInch }
        : { centsPerLitre: draft.centsPerLitre }
      : draft.model === 'shelf'
        ? { shelfCents: draft.shelfCents, shelfStep: draft.shelfStep }
        : { kilnCents: draft.kilnCents }
  return {
    currency: draft.currency,
    model: draft.model,
    ...byModel,
    minimumPerPieceCents: draft.minimumPerPieceCents,
    surcharges: draft.surcharges,
    deposit: draft.depositKind === 'percent' ? { percent: draft.deposit.percent } : { fixedCents: draft.deposit.fixedCents },
  }
}

const checkInputSchema = z.object({ kiln: kilnSchema, firing: firingSpecSchema, pieces: piecesSchema })

export interface CheckInput {
  kiln: Kiln
  firing: Firing
  pieces: Piece[]
}

export interface ParsedPlanner {
  /** null while any kiln, firing or piece field does not parse. */
  input: CheckInput | null
  /** null when no quote is asked for or the price list does not parse. */
  priceList: PriceList | null
  messages: FieldMessages
}

export function parsePlanner(values: PlannerValues, units: UnitSystem): ParsedPlanner {
  const messages: FieldMessages = {}
  const coreInput = checkInputOf(values)
  const core = checkInputSchema.safeParse(coreInput)
  if (!core.success) collectMessages(messages, core.error, coreInput, '', units)
  let priceList: PriceList | null = null
  if (values.quoteOn) {
    const priceInput = priceListInputOf(values.priceList)
    const parsed = priceListSchema.safeParse(priceInput)
    if (parsed.success) priceList = parsed.data
    else collectMessages(messages, parsed.error, priceInput, 'priceList.', units)
  }
  return { input: core.success ? core.data : null, priceList, messages }
}
