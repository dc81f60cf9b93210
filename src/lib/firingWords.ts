// Kilns, firings and the studio's terms in plain words, as potters and studios read them.
import type { Atmosphere, CoolingProfile, FiringKind, Kiln, KilnInterior, KilnKind } from '../../shared/firing/check'
import { formatCone } from '../../shared/firing/cones'
import { DAMAGE_CHARGE_KINDS, DAMAGE_CHARGE_LABELS, damageChargesOf } from '../../shared/claims'
import { formatMoney } from '../../shared/dates'
import type { StudioPolicies } from '../../shared/schemas/studios'
import { formatLength, type UnitSystem } from './units'

export const KILN_KINDS: readonly { value: KilnKind; label: string }[] = [
  { value: 'electric', label: 'Electric' },
  { value: 'gas', label: 'Gas' },
  { value: 'wood', label: 'Wood' },
  { value: 'soda', label: 'Soda' },
  { value: 'salt', label: 'Salt' },
  { value: 'raku', label: 'Raku' },
]

export const ATMOSPHERES: readonly { value: Atmosphere; label: string }[] = [
  { value: 'oxidation', label: 'Oxidation' },
  { value: 'reduction', label: 'Reduction' },
  { value: 'neutral', label: 'Neutral' },
]

export const FIRING_KINDS: readonly { value: FiringKind; label: string }[] = [
  { value: 'bisque', label: 'Bisque' },
  { value: 'glaze', label: 'Glaze' },
  { value: 'single', label: 'Single firing' },
  { value: 'lustre', label: 'Lustre, decals and china paint' },
  { value: 'raku', label: 'Raku' },
]

export const COOLING_CHOICES: readonly { value: CoolingProfile; label: string; hint: string }[] = [
  { value: 'natural', label: 'Natural cool', hint: 'The kiln cools by itself.' },
  {
    value: 'glaze-development',
    label: 'Slow through glaze development',
    hint: 'About 80 °C/h from 1040 to 760 °C, for mattes and crystals to grow. Needs controlled cooling.',
  },
  { value: 'drop-and-hold', label: 'Drop and hold', hint: 'Down about 55 °C from the peak, held 30 minutes, to heal pinholes.' },
]

export const coolingLabel = (cooling: CoolingProfile) => COOLING_CHOICES.find((c) => c.value === cooling)?.label ?? cooling

const kindLabel = (kind: KilnKind) => KILN_KINDS.find((k) => k.value === kind)?.label ?? kind
export const firingKindLabel = (kind: FiringKind) => FIRING_KINDS.find((k) => k.value === kind)?.label ?? kind

/** "a, b and c" */
export function listInWords(items: readonly string[], last = 'and'): string {
  if (items.length <= 1) return items.join('')
  return `${items.slice(0, -1).join(', ')} ${last} ${items[items.length - 1]}`
}

export function interiorInWords(interior: KilnInterior, units: UnitSystem): string {
  const tall = `${formatLength(interior.heightMm, units)} tall`
  if (interior.shape === 'round') return `${formatLength(interior.diameterMm, units)} across × ${tall}`
  return `${formatLength(interior.widthMm, units)} wide × ${formatLength(interior.depthMm, units)} deep × ${tall}`
}

/** "Electric, oxidation, cone 022 to 10, 28 in across × 27 in tall, usable 25.4 in" */
export function kilnLimitsInWords(
  kiln: Pick<Kiln, 'kind' | 'atmospheres' | 'minCone' | 'maxCone' | 'interior'> & { effectiveUsableHeightMm: number },
  units: UnitSystem,
): string {
  return [
    kindLabel(kiln.kind),
    listInWords(kiln.atmospheres, 'or'),
    `cone ${kiln.minCone} to ${kiln.maxCone}`,
    interiorInWords(kiln.interior, units),
    `usable ${formatLength(kiln.effectiveUsableHeightMm, units)}`,
  ].join(', ')
}

/** "Glaze, cone 6 oxidation" (with slow cooling and the cooling profile when asked). */
export function firingInWords(firing: {
  kind: FiringKind
  cone: string
  atmosphere: Atmosphere
  slowCool?: boolean
  cooling?: CoolingProfile
}): string {
  const cooling = firing.cooling && firing.cooling !== 'natural' ? `, ${coolingLabel(firing.cooling).toLowerCase()}` : ''
  return `${firingKindLabel(firing.kind)}, ${formatCone(firing.cone)} ${firing.atmosphere}${firing.slowCool ? ', slow cooled' : ''}${cooling}`
}

/** The studio's terms in a potter's words: what clay it takes, what comes back on withdrawing, how long the space is held. */
export function policiesInWords(policies: StudioPolicies): string[] {
  const { fullRefundDaysBefore: days, laterRefundPercent: percent } = policies.cancellation
  const later = percent >= 100 ? 'all of it still does' : percent <= 0 ? 'none of it does' : `${percent} % of it does`
  const withdrawing =
    days === 0
      ? percent >= 100
        ? 'Withdraw any time before the firing and everything you paid comes back.'
        : `Withdraw before the firing and ${percent} % of what you paid comes back.`
      : `Withdraw ${days} ${days === 1 ? 'day' : 'days'} or more before the firing and everything you paid comes back; later, ${later}.`
  return [
    `Takes ${listInWords(policies.clayBodies)} clay bodies.`,
    withdrawing,
    `Once the studio takes your ware on, the space is held ${policies.depositHoldHours} hours for the deposit.`,
  ]
}

/**
 * The most the studio may claim when a potter's ware damages the kiln, its shelves or other ware, one
 * line a charge: "Kiln cleaning after a blowout: up to $60.00"; a charge of 0 is one it does not make.
 */
export function damageChargesInWords(policies: StudioPolicies, currency: string): string[] {
  const charges = damageChargesOf(policies)
  return DAMAGE_CHARGE_KINDS.map((kind) =>
    charges[kind] > 0
      ? `${DAMAGE_CHARGE_LABELS[kind]}: up to ${formatMoney(charges[kind], currency)}`
      : `${DAMAGE_CHARGE_LABELS[kind]}: no charge`,
  )
}
