import { formatDate, formatMoney } from '../../../shared/dates'
import type { MailContent } from '../render'
import type { RequestFacts } from './requests'

/** What a payout mail to a studio's owner says about the request the money is for. */
export interface PayoutFacts {
  ownerName: string
  studioName: string
  potterName: string
  firingDate: Date
  timezone: string
  currency: string
  moneyUrl: string
}

const firing = (p: PayoutFacts) => `${p.potterName}’s ware in the firing of ${formatDate(p.firingDate, p.timezone)}`

export function transferredMail(p: PayoutFacts, amountCents: number, feeCents: number): MailContent {
  return {
    subject: `${formatMoney(amountCents, p.currency)} transferred to ${p.studioName}`,
    greeting: `Hello ${p.ownerName},`,
    paragraphs: [
      `Your share for ${firing(p)} is on its way: ${formatMoney(amountCents, p.currency)} went to your Stripe account, which sends it on to your bank.`,
    ],
    details: [
      ['Transferred', formatMoney(amountCents, p.currency)],
      ['Conewright’s fee', formatMoney(feeCents, p.currency)],
    ],
    action: { label: 'See the studio’s money', url: p.moneyUrl },
  }
}

export function reversedMail(p: PayoutFacts, amountCents: number): MailContent {
  return {
    subject: `${formatMoney(amountCents, p.currency)} taken back from a transfer to ${p.studioName}`,
    greeting: `Hello ${p.ownerName},`,
    paragraphs: [
      `${p.potterName} was refunded for ${firing(p)}. Your share of that refund, ${formatMoney(amountCents, p.currency)}, was taken back from the transfer for it; Conewright’s fee shrank with it.`,
    ],
    action: { label: 'See the studio’s money', url: p.moneyUrl },
  }
}

export function payoutWaitingMail(p: PayoutFacts, amountCents: number): MailContent {
  return {
    subject: `${formatMoney(amountCents, p.currency)} is waiting for ${p.studioName}`,
    greeting: `Hello ${p.ownerName},`,
    paragraphs: [
      `You have earned ${formatMoney(amountCents, p.currency)} for ${firing(p)}. Conewright keeps it for you until the studio has a payout account: set one up and it is sent at once.`,
    ],
    action: { label: 'Set up payouts', url: p.moneyUrl },
  }
}

export function payoutsOnMail(ownerName: string, studioName: string, moneyUrl: string): MailContent {
  return {
    subject: `Payouts are on for ${studioName}`,
    greeting: `Hello ${ownerName},`,
    paragraphs: [
      'Stripe has verified your payout account. What Conewright was keeping for you is being transferred now, and every collected firing is paid from here on.',
    ],
    action: { label: 'See the studio’s money', url: moneyUrl },
  }
}

export function disputeSettledMail(r: RequestFacts, note: string): MailContent {
  return {
    subject: `Dispute settled: ${r.potterName}’s ware at ${r.studioName}`,
    paragraphs: [
      'The Conewright desk has settled the dispute about this ask.',
      ...(note ? [`The desk’s note: “${note}”`] : []),
      'Any refund the desk made has gone back to the potter; what the studio keeps is released to it.',
    ],
    action: { label: 'See the ask', url: r.requestUrl },
  }
}
