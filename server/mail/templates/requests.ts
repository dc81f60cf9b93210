import { formatDateTime, formatMoney } from '../../../shared/dates'
import { formatCone } from '../../../shared/firing/cones'
import type { MailContent } from '../render'

/** What every mail about a potter's ask says about the firing it is for. */
export interface RequestFacts {
  requestUrl: string
  potterName: string
  studioName: string
  kilnName: string
  cone: string
  atmosphere: string
  kind: string
  firingDate: Date
  dropOffBy: Date
  timezone: string
  pieceCount: number
  currency: string
  totalCents: number
  depositCents: number
}

const title = (r: RequestFacts) => `${formatCone(r.cone)} ${r.atmosphere} ${r.kind} firing at ${r.studioName}`
const money = (r: RequestFacts, cents: number) => formatMoney(cents, r.currency)
const firingRows = (r: RequestFacts): [string, string][] => [
  ['Firing', title(r)],
  ['Kiln', r.kilnName],
  ['Drop off by', formatDateTime(r.dropOffBy, r.timezone)],
  ['Fires', formatDateTime(r.firingDate, r.timezone)],
  ['Pieces', String(r.pieceCount)],
]

export function requestSentMail(r: RequestFacts): MailContent {
  return {
    subject: `${r.potterName} asks for space in the ${title(r)}`,
    paragraphs: [
      `${r.potterName} asks for space in the ${title(r)}. The ware passed Conewright’s check; see the findings and the quote before you take it on or turn it down.`,
    ],
    details: [...firingRows(r), ['Quote', money(r, r.totalCents)]],
    action: { label: 'Open the ask', url: r.requestUrl },
  }
}

export function requestAcceptedMail(r: RequestFacts, depositDueAt: Date | null): MailContent {
  return {
    subject: `Taken on: your ware in the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} has taken your ware on and is holding space for it.`,
      depositDueAt
        ? `Pay the deposit of ${money(r, r.depositCents)} by ${formatDateTime(depositDueAt, r.timezone)} to hold the space; after that it goes back to the studio.`
        : 'No deposit is needed. Bring the ware by the drop-off deadline.',
    ],
    details: [...firingRows(r), ['Quote', money(r, r.totalCents)], ['Deposit', money(r, r.depositCents)]],
    action: { label: depositDueAt ? 'Pay the deposit' : 'See it on Conewright', url: r.requestUrl },
  }
}

export function requestDeclinedMail(r: RequestFacts, reason: string): MailContent {
  return {
    subject: `Turned down: your ask for the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} cannot take this ware in that firing.`,
      `Their reason: “${reason}”`,
      'You can look for another firing on Conewright.',
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function studioCancelledMail(r: RequestFacts, reason: string, refundCents: number): MailContent {
  return {
    subject: `Called off by the studio: your ware in the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} has called off your place in this firing.`,
      `Their reason: “${reason}”`,
      refundCents > 0
        ? `Everything you paid, ${money(r, refundCents)}, is being refunded to your card.`
        : 'You had paid nothing, so nothing is owed either way.',
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function moveProposedMail(
  r: RequestFacts,
  proposed: { firingDate: Date; cone: string; atmosphere: string; kind: string },
): MailContent {
  return {
    subject: `${r.studioName} suggests another firing for your ware`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} cannot fit your ware in the firing you chose and offers another one instead: the ${formatCone(proposed.cone)} ${proposed.atmosphere} ${proposed.kind} firing on ${formatDateTime(proposed.firingDate, r.timezone)}.`,
      'Move to take that place, or say no and your ask stays where it was.',
    ],
    details: firingRows(r),
    action: { label: 'Answer the suggestion', url: r.requestUrl },
  }
}

export function depositReceivedMail(r: RequestFacts, audience: 'potter' | 'studio', amountCents: number): MailContent {
  return {
    subject: audience === 'potter' ? `Deposit received for the ${title(r)}` : `Deposit paid: ${r.potterName}, ${title(r)}`,
    paragraphs: [
      audience === 'potter'
        ? `We received your deposit of ${money(r, amountCents)}. Your space is held: bring the ware by the drop-off deadline.`
        : `${r.potterName} paid the deposit of ${money(r, amountCents)}. Their space is held.`,
    ],
    details: [
      ...firingRows(r),
      ['Deposit paid', money(r, amountCents)],
      ['Balance at pickup', money(r, Math.max(0, r.totalCents - amountCents))],
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function holdReleasedMail(r: RequestFacts, audience: 'potter' | 'studio'): MailContent {
  return {
    subject:
      audience === 'potter'
        ? `Space released: the deposit for the ${title(r)} was not paid`
        : `Space released: ${r.potterName} did not pay the deposit`,
    paragraphs: [
      audience === 'potter'
        ? `The deposit for your place in the ${title(r)} was not paid in time, so the space went back to the studio. You can ask again if there is still room.`
        : `${r.potterName} did not pay the deposit in time. Their space in the ${title(r)} is free again.`,
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function withdrawnMail(r: RequestFacts, refundCents: number, reason: string | undefined): MailContent {
  return {
    subject: `Withdrawn: ${r.potterName}, ${title(r)}`,
    paragraphs: [
      `${r.potterName} withdrew their ask${reason ? `: “${reason}”` : '.'}`,
      refundCents > 0 ? `Under your terms ${money(r, refundCents)} is refunded to them.` : 'Under your terms nothing is refunded.',
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function refundedMail(r: RequestFacts, amountCents: number): MailContent {
  return {
    subject: `Refund of ${money(r, amountCents)} for the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `A refund of ${money(r, amountCents)} is on its way to the card you paid with. Banks usually show it within 5–10 business days.`,
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function newMessagesMail(r: RequestFacts, messages: { author: string; body: string }[]): MailContent {
  return {
    subject: `${messages.length === 1 ? 'A new message' : `${messages.length} new messages`} about the ${title(r)}`,
    paragraphs: [...messages.map((m) => `${m.author}: ${m.body}`), 'Answer on Conewright so the whole thread stays with the firing.'],
    action: { label: 'Open the thread', url: r.requestUrl },
  }
}

export function disputedMail(r: RequestFacts, by: string, reason: string): MailContent {
  return {
    subject: `Dispute raised: the ${title(r)}`,
    paragraphs: [
      `${by} raised a dispute about this firing: “${reason}”`,
      'The Conewright desk will look at the record (drop-off, firing log, results and messages) and contact both sides.',
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

/** Why an ask lapsed, in the reader's words. */
export type LapseCause = 'firing-closed' | 'firing-loading' | 'deposit-late' | 'drop-off-passed'

const LAPSE_WORDS: Record<LapseCause, { potter: string; studio: (potter: string) => string }> = {
  'firing-closed': {
    potter: 'The studio stopped taking ware for this firing before your ask was settled.',
    studio: (p) => `The firing stopped taking ware, so ${p}’s ask, still waiting, has lapsed.`,
  },
  'firing-loading': {
    potter: 'The studio started loading this firing before your ask was settled.',
    studio: (p) => `Loading started, so ${p}’s ask, still waiting, has lapsed.`,
  },
  'deposit-late': {
    potter: 'The deposit was not paid in time, so the space went back to the studio.',
    studio: (p) => `${p} did not pay the deposit in time; the space is free again.`,
  },
  'drop-off-passed': {
    potter: 'The drop-off deadline passed before the studio answered your ask.',
    studio: (p) => `The drop-off deadline passed with ${p}’s ask still unanswered; it has lapsed.`,
  },
}

export function lapsedMail(r: RequestFacts, audience: 'potter' | 'studio', cause: LapseCause, refundCents: number): MailContent {
  const words = LAPSE_WORDS[cause]
  return {
    subject: audience === 'potter' ? `Lapsed: your ask for the ${title(r)}` : `Lapsed: ${r.potterName}, ${title(r)}`,
    ...(audience === 'potter' ? { greeting: `Hello ${r.potterName},` } : {}),
    paragraphs: [
      audience === 'potter' ? words.potter : words.studio(r.potterName),
      refundCents > 0
        ? audience === 'potter'
          ? `${money(r, refundCents)} you paid is being refunded to your card.`
          : `${money(r, refundCents)} the potter paid is refunded to them.`
        : 'Nothing was paid, so nothing is owed either way.',
      ...(audience === 'potter' ? ['You can look for another firing on Conewright.'] : []),
    ],
    details: firingRows(r),
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}
