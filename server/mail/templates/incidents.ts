import { formatDate, formatMoney } from '../../../shared/dates'
import type { MailContent } from '../render'
import type { RequestFacts } from './requests'

/** What an incident mail says of the incident besides the ask's own facts. */
export interface IncidentFacts {
  incidentUrl: string
  kindLabel: string
  phaseLabel: string | null
  /** Links to the incident's photos, for those whose ware was hurt. */
  photoUrls: string[]
}

/** What a claim mail says of the claim. */
export interface ClaimFacts {
  chargeLabel: string
  amountCents: number
  currency: string
  note: string
}

const when = (r: RequestFacts) => `the firing of ${formatDate(r.firingDate, r.timezone)} at ${r.studioName}`
const claimRows = (c: ClaimFacts): [string, string][] => [
  ['For', c.chargeLabel],
  ['Amount', formatMoney(c.amountCents, c.currency)],
]

export function incidentReportedMail(r: RequestFacts, i: IncidentFacts, by: 'potter' | 'studio'): MailContent {
  return {
    subject: `Something went wrong in ${when(r)}: ${i.kindLabel.toLowerCase()}`,
    paragraphs: [
      by === 'studio'
        ? `${r.studioName} reported that ${r.potterName}’s ware failed in ${when(r)}: ${i.kindLabel.toLowerCase()}.`
        : `${r.potterName} reported a problem with their ware in ${when(r)}: ${i.kindLabel.toLowerCase()}.`,
      i.phaseLabel ? `Conewright’s reading of what was seen and of the firing’s log: most likely ${i.phaseLabel.toLowerCase()}.` : '',
    ].filter(Boolean),
    action: { label: 'See what happened', url: i.incidentUrl },
  }
}

export function wareHurtMail(r: RequestFacts, i: IncidentFacts): MailContent {
  return {
    subject: `Your ware was hurt in ${when(r)}`,
    paragraphs: [
      `Another potter’s piece failed in ${when(r)} (${i.kindLabel.toLowerCase()}), and some of your pieces were hurt by it. ${r.studioName} will tell you whether it can credit or refire them.`,
      ...(i.photoUrls.length ? ['Photos of the kiln as it was opened are linked below.'] : []),
    ],
    details: i.photoUrls.map((url, n) => [`Photo ${n + 1}`, url] as [string, string]),
    action: { label: 'See what happened', url: i.incidentUrl },
  }
}

export function claimRaisedMail(r: RequestFacts, c: ClaimFacts, incidentUrl: string, keptCard: string | null = null): MailContent {
  return {
    subject: `${r.studioName} asks ${formatMoney(c.amountCents, c.currency)} for damage in ${when(r)}`,
    paragraphs: [
      `Under its terms, ${r.studioName} asks you to pay for damage your ware caused in ${when(r)}. You can pay it by card, or contest it and the Conewright front desk will look at both sides.`,
      ...(keptCard
        ? [`You kept ${keptCard} at the deposit, so you can pay in one step if you accept. Nothing is charged until you do.`]
        : []),
      ...(c.note ? [`The studio’s note: “${c.note}”`] : []),
    ],
    details: claimRows(c),
    action: { label: 'Pay or contest', url: incidentUrl },
  }
}

export function claimPaidMail(r: RequestFacts, c: ClaimFacts, incidentUrl: string): MailContent {
  return {
    subject: `Damage claim paid: ${formatMoney(c.amountCents, c.currency)} for ${when(r)}`,
    paragraphs: [
      `${r.potterName} paid the damage claim for ${when(r)}. The studio’s share is paid out with its other earnings for the ask.`,
    ],
    details: claimRows(c),
    action: { label: 'See the incident', url: incidentUrl },
  }
}

export function claimContestedMail(r: RequestFacts, c: ClaimFacts, reason: string, incidentUrl: string): MailContent {
  return {
    subject: `${r.potterName} contests the damage claim for ${when(r)}`,
    paragraphs: [
      `${r.potterName} contests the claim. The Conewright front desk will look at the incident, the log and both sides’ words, and uphold or waive it.`,
      `${r.potterName}’s reason: “${reason}”`,
    ],
    details: claimRows(c),
    action: { label: 'See the incident', url: incidentUrl },
  }
}

export function claimDecidedMail(
  r: RequestFacts,
  c: ClaimFacts,
  decision: 'uphold' | 'waive',
  note: string,
  incidentUrl: string,
): MailContent {
  return {
    subject: `Damage claim ${decision === 'uphold' ? 'upheld' : 'waived'} by the front desk`,
    paragraphs: [
      decision === 'uphold'
        ? `The Conewright front desk upheld ${r.studioName}’s claim for ${when(r)}. ${r.potterName} is asked to pay it.`
        : `The Conewright front desk waived ${r.studioName}’s claim for ${when(r)}. Nothing is owed.`,
      ...(note ? [`The desk’s note: “${note}”`] : []),
    ],
    details: claimRows(c),
    action: { label: 'See the incident', url: incidentUrl },
  }
}

/** What a mail about making good says of it. */
export interface RemedyFacts {
  incidentUrl: string
  kindLabel: string
  note: string
}

export function creditGivenMail(
  r: RequestFacts,
  i: RemedyFacts,
  credit: { amountCents: number; onlineCents: number; counterCents: number; currency: string },
  to: 'potter' | 'studio',
): MailContent {
  const how = [
    credit.onlineCents > 0 ? `${formatMoney(credit.onlineCents, credit.currency)} goes back to the card you paid with.` : '',
    credit.counterCents > 0
      ? `${formatMoney(credit.counterCents, credit.currency)} of what you paid at the counter is handed back there: ${r.studioName} owes it to you.`
      : '',
  ].filter(Boolean)
  return {
    subject: `${r.studioName} credits ${formatMoney(credit.amountCents, credit.currency)} for your ware hurt in ${when(r)}`,
    paragraphs: [
      to === 'potter'
        ? `Your pieces were hurt when another potter’s piece failed in ${when(r)} (${i.kindLabel.toLowerCase()}). ${r.studioName} makes good with a credit on your ask.`
        : `You credited ${r.potterName} for pieces hurt in ${when(r)} (${i.kindLabel.toLowerCase()}).`,
      ...(to === 'potter'
        ? how
        : [
            credit.onlineCents > 0
              ? `${formatMoney(credit.onlineCents, credit.currency)} is refunded to the potter’s card and comes out of your share of this ask.`
              : '',
            credit.counterCents > 0
              ? `Hand ${formatMoney(credit.counterCents, credit.currency)} back at the counter and mark it on the ask.`
              : '',
          ].filter(Boolean)),
      ...(i.note ? [`The studio’s note: “${i.note}”`] : []),
    ],
    details: [['Credit', formatMoney(credit.amountCents, credit.currency)]],
    action: { label: 'See the incident', url: i.incidentUrl },
  }
}

export function refirePromisedMail(
  r: RequestFacts,
  i: RemedyFacts,
  refire: { tags: string[]; firing: { date: Date; kilnName: string } | null },
  to: 'potter' | 'studio',
): MailContent {
  const where = refire.firing
    ? `in the ${refire.firing.kilnName} firing of ${formatDate(refire.firing.date, r.timezone)}`
    : 'in a coming firing'
  return {
    subject: `${r.studioName} will refire your hurt pieces free`,
    paragraphs: [
      to === 'potter'
        ? `Your pieces were hurt when another potter’s piece failed in ${when(r)} (${i.kindLabel.toLowerCase()}). ${r.studioName} promises to refire them free ${where}.`
        : `You promised ${r.potterName} a free refire of pieces hurt in ${when(r)}, ${where}.`,
      ...(i.note ? [`The studio’s note: “${i.note}”`] : []),
    ],
    details: [['Pieces', refire.tags.join(', ')]],
    action: { label: 'See the incident', url: i.incidentUrl },
  }
}
