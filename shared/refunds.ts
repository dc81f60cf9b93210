// A studio's cancellation terms as data: everything paid comes back until N days before the firing,
// P % of it after (rounded half-up to the cent). The server refunds by this rule; the page shows the
// same figure before the potter confirms.
import { roundHalfUpCents } from './firing/quote'

export interface CancellationTerms {
  fullRefundDaysBefore: number
  laterRefundPercent: number
}

export interface RefundUnderTerms {
  refundCents: number
  /** Whether the full-refund window is still open. */
  full: boolean
  /** The last moment of the full-refund window. */
  fullUntil: Date
}

export function refundUnderTerms(
  paidCents: number,
  firingDate: Date | string,
  terms: CancellationTerms,
  now = new Date(),
): RefundUnderTerms {
  const fullUntil = new Date(new Date(firingDate).getTime() - terms.fullRefundDaysBefore * 86_400_000)
  if (now.getTime() <= fullUntil.getTime()) return { refundCents: paidCents, full: true, fullUntil }
  return { refundCents: Math.min(paidCents, roundHalfUpCents((paidCents * terms.laterRefundPercent) / 100)), full: false, fullUntil }
}
