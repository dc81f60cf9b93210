import { formatDateTime, formatMoney } from '../../../shared/dates'
import { formatCone } from '../../../shared/firing/cones'
import { REVIEW_WINDOW_DAYS } from '../../../shared/reviews'
import type { MailContent } from '../render'
import type { RequestFacts } from './requests'

const title = (r: RequestFacts) => `${formatCone(r.cone)} ${r.atmosphere} ${r.kind} firing at ${r.studioName}`

export interface CheckInFacts {
  rows: { label: string; declared: number; received: number; held?: number; measured?: string }[]
  conditionNotes: string
  quoteBeforeCents: number
  quoteAfterCents: number
  needsConfirmation: boolean
}

export function dropOffMail(r: RequestFacts, c: CheckInFacts): MailContent {
  const changed = c.quoteAfterCents !== c.quoteBeforeCents
  return {
    subject: `Ware received at ${r.studioName}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} took your ware in for the ${title(r)} on ${formatDateTime(new Date(), r.timezone)}. This is what they recorded.`,
      c.conditionNotes ? `Condition at drop-off: ${c.conditionNotes}` : 'No damage was noted at drop-off.',
      ...(changed
        ? [
            `The measured ware changes the price from ${formatMoney(c.quoteBeforeCents, r.currency)} to ${formatMoney(c.quoteAfterCents, r.currency)}.${c.needsConfirmation ? ' Please confirm the new price on Conewright before the firing.' : ''}`,
          ]
        : []),
    ],
    details: c.rows.map(
      (row) =>
        [
          row.label,
          `${row.received} of ${row.declared} received${row.held ? `, ${row.held} held back` : ''}${row.measured ? `, measured ${row.measured}` : ''}`,
        ] as [string, string],
    ),
    action: { label: changed && c.needsConfirmation ? 'Confirm the new price' : 'See it on Conewright', url: r.requestUrl },
  }
}

export function refusedMail(r: RequestFacts, reason: string, refundCents: number): MailContent {
  return {
    subject: `Ware turned away at ${r.studioName}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} could not take your ware into the ${title(r)}.`,
      `Their reason: “${reason}”`,
      refundCents > 0
        ? `Under the studio’s terms ${formatMoney(refundCents, r.currency)} is refunded to you.`
        : 'Under the studio’s terms the deposit is not refunded.',
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function noShowMail(r: RequestFacts, refundCents: number): MailContent {
  return {
    subject: `The ${title(r)} was loaded without your ware`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `Your ware was not dropped off before ${r.studioName} loaded the kiln, so your place in this firing has lapsed.`,
      refundCents > 0
        ? `Under the studio’s terms ${formatMoney(refundCents, r.currency)} is refunded to you.`
        : 'Under the studio’s terms the deposit is not refunded.',
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

export function readyMail(r: RequestFacts, dropOffHours: string, owedCents: number): MailContent {
  return {
    subject: `Ready for pickup: your ware from the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `Your ware is out of the kiln and ready for pickup at ${r.studioName}. The results and photos are on Conewright.`,
      owedCents > 0
        ? `${formatMoney(owedCents, r.currency)} is still owed: pay it online before you come, or at the counter.`
        : 'Everything is paid.',
    ],
    details: [
      ['Pickup hours', dropOffHours || 'Ask the studio'],
      ['Still owed', formatMoney(owedCents, r.currency)],
    ],
    action: { label: owedCents > 0 ? 'Pay and see the results' : 'See the results', url: r.requestUrl },
  }
}

export function pickupMail(
  r: RequestFacts,
  receipt: { label: string; amountCents: number }[],
  paidCents: number,
  refundedCents: number,
): MailContent {
  return {
    subject: `Picked up: your receipt from ${r.studioName}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `You picked up your ware from the ${title(r)} on ${formatDateTime(new Date(), r.timezone)}. Thank you. This is your receipt.`,
      `Once you have used the pots a while, answer a few questions about the firing. Neither you nor the studio sees the other’s answers until both have answered, or for ${REVIEW_WINDOW_DAYS} days.`,
    ],
    details: [
      ...receipt.map((line) => [line.label, formatMoney(line.amountCents, r.currency)] as [string, string]),
      ['Paid', formatMoney(paidCents, r.currency)],
      ...(refundedCents ? [['Refunded', formatMoney(refundedCents, r.currency)] as [string, string]] : []),
    ],
    action: { label: 'Answer about the firing', url: r.requestUrl },
  }
}

export function firingProgressMail(r: RequestFacts, stage: 'firing' | 'unloaded'): MailContent {
  return {
    subject: stage === 'firing' ? `Your ware is firing at ${r.studioName}` : `Unloaded: the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      stage === 'firing'
        ? `The ${title(r)} has started. The firing log is on Conewright as the studio writes it.`
        : 'The kiln is open and the studio is looking over the ware. Results and photos follow on Conewright.',
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

/** The studio hears how the potter answered a price raised at check-in. */
export function priceAnsweredMail(r: RequestFacts, answer: 'confirmed' | 'declined', refundCents: number): MailContent {
  return {
    subject: `${answer === 'confirmed' ? 'New price confirmed' : 'New price turned down'}: ${r.potterName}, ${title(r)}`,
    paragraphs: [
      answer === 'confirmed'
        ? `${r.potterName} agreed to the price from the measured ware, ${formatMoney(r.totalCents, r.currency)}. The ware can go in the kiln.`
        : `${r.potterName} turned down the price from the measured ware, so their ask is withdrawn: keep the ware aside for them to pick up, and leave it out of the load.`,
      ...(answer === 'declined' && refundCents > 0
        ? [`Everything they paid, ${formatMoney(refundCents, r.currency)}, is refunded to them in full.`]
        : []),
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

/** The potter's own record of turning the new price down. */
export function priceDeclinedPotterMail(r: RequestFacts, refundCents: number): MailContent {
  return {
    subject: `Withdrawn at the new price: the ${title(r)}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      'You turned down the price from the measured ware, so your ask is withdrawn and your ware will not be fired.',
      refundCents > 0
        ? `Everything you paid, ${formatMoney(refundCents, r.currency)}, is being refunded to your card.`
        : 'You had paid nothing, so nothing is owed.',
      `Pick your ware up from ${r.studioName} during their opening hours.`,
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

/** A payment came in: a receipt to the potter, a note to the studio. */
export function paymentReceivedMail(
  r: RequestFacts,
  audience: 'potter' | 'studio',
  payment: { what: 'deposit' | 'balance'; how: 'online' | 'counter'; amountCents: number; paidCents: number; owedCents: number },
): MailContent {
  const amount = formatMoney(payment.amountCents, r.currency)
  const where = payment.how === 'online' ? 'online' : `at the counter of ${r.studioName}`
  return {
    subject:
      audience === 'potter'
        ? `Receipt: ${amount} ${payment.what === 'deposit' ? 'deposit' : 'balance'} for the ${title(r)}`
        : `Paid: ${r.potterName}, ${amount} ${payment.what === 'deposit' ? 'toward the deposit' : 'toward the balance'}`,
    ...(audience === 'potter' ? { greeting: `Hello ${r.potterName},` } : {}),
    paragraphs: [
      audience === 'potter'
        ? `We received ${amount} ${where}. This is your receipt.`
        : `${r.potterName} paid ${amount} ${payment.how === 'online' ? 'online' : 'at your counter'}.`,
      payment.owedCents > 0
        ? `${formatMoney(payment.owedCents, r.currency)} is still owed ${payment.what === 'deposit' ? 'toward the deposit' : 'before pickup'}.`
        : payment.what === 'deposit'
          ? 'The deposit is paid: the space is held.'
          : 'Nothing more is owed.',
    ],
    details: [
      ['Price', formatMoney(r.totalCents, r.currency)],
      ['Paid so far', formatMoney(payment.paidCents, r.currency)],
      ['Still owed', formatMoney(payment.owedCents, r.currency)],
    ],
    action: { label: 'See it on Conewright', url: r.requestUrl },
  }
}

/** One side has answered about the firing; the other hears that theirs is awaited, not what was said. */
export function reviewGivenMail(r: RequestFacts, audience: 'potter' | 'studio', closesAt: Date): MailContent {
  const who = audience === 'potter' ? r.studioName : r.potterName
  return {
    subject: `${who} answered about the ${title(r)}`,
    ...(audience === 'potter' ? { greeting: `Hello ${r.potterName},` } : {}),
    paragraphs: [
      `${who} has given their answers after pickup. You see them once you have given yours, or on ${formatDateTime(closesAt, r.timezone)}, when whatever both sides have answered is published.`,
      'Answers are final once sent, so neither side answers the other.',
    ],
    action: { label: 'Give your answers', url: r.requestUrl },
  }
}

/** The answers are public: both sides answered, or the window closed. */
export function reviewsPublishedMail(r: RequestFacts, audience: 'potter' | 'studio', bothAnswered: boolean): MailContent {
  return {
    subject: `Answers published: the ${title(r)}`,
    ...(audience === 'potter' ? { greeting: `Hello ${r.potterName},` } : {}),
    paragraphs: [
      bothAnswered
        ? 'Both sides have answered about this firing, so the answers are now shown to each other.'
        : 'The window for answers has closed, so the answers given are now shown.',
      audience === 'potter'
        ? 'What you said about the studio now counts on its public page and in search.'
        : 'What you said about the potter now shows on their record to studios.',
    ],
    action: { label: 'See the answers', url: r.requestUrl },
  }
}

/** One piece of a request, as a mail names it. */
export interface PieceFacts {
  tag: string
  label: string
  copy: number
  of: number
}

const pieceName = (p: PieceFacts) => `${p.label} ${p.copy} of ${p.of} (tag ${p.tag})`

/** A piece held back at drop-off or before loading: the reason, and that the rest of the ware goes on. */
export function pieceHeldMail(r: RequestFacts, piece: PieceFacts, reason: string): MailContent {
  return {
    subject: `One piece held back at ${r.studioName}: ${piece.tag}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [
      `${r.studioName} is holding ${pieceName(piece)} back from the ${title(r)}.`,
      `Their reason: “${reason}”`,
      'The rest of your ware goes on as planned. The held piece waits for you at the studio; its photo is on the ask.',
    ],
    action: { label: 'See the piece', url: `${r.requestUrl}#pieces` },
  }
}

/** A held piece taken into the load after all. */
export function pieceReleasedMail(r: RequestFacts, piece: PieceFacts): MailContent {
  return {
    subject: `Back in the load: ${piece.tag}`,
    greeting: `Hello ${r.potterName},`,
    paragraphs: [`${r.studioName} took ${pieceName(piece)} back into the ${title(r)} after all.`],
    action: { label: 'See the ask', url: r.requestUrl },
  }
}
