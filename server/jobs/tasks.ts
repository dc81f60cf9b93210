import type { TaskList } from 'graphile-worker'
import { REINDEX_TASK, reindexAll, SYNC_STUDIO_TASK, syncStudio } from '../services/search-sync'
import type { AppContext } from '../context'
import { FiringRequest } from '../entities/FiringRequest'
import { sendQueuedMail } from '../services/mail'
import { MESSAGE_DIGEST_TASK, sendMessageDigest } from '../services/messages'
import { EXPIRE_CHECKOUTS_TASK, makeRefund, OPEN_CHECKOUT_TASK, openCheckout, REFUND_TASK } from '../services/payments'
import { DEPOSIT_EXPIRY_TASK, expireDepositHold, sweepStaleRequests } from '../services/requests'
import { PUBLISH_REVIEWS_TASK, publishDueReviews } from '../services/reviews'
import { expireOpenCheckouts } from '../services/payments'
import { engineRebuilt } from '../services/search'
import { PAYOUT_SWEEP_TASK, PAYOUT_TASK, payStudio, sweepPayouts } from '../services/payouts'
import { PROCESS_PHOTO_TASK, processPhoto } from '../services/photos'
import { KEEP_CARD_TASK, keepCard } from '../services/kept-cards'

/** The scheduled sweep of requests made stale by dates alone (see sweepStaleRequests). */
export const REQUEST_SWEEP_TASK = 'request-sweep'

/** Every background task by name. Handlers are thin: the work lives in services. */
export function taskList(ctx: AppContext): TaskList {
  return {
    'send-mail': async (payload) => {
      await sendQueuedMail(ctx, (payload as { mailId: string }).mailId)
    },
    [SYNC_STUDIO_TASK]: async (payload) => {
      await syncStudio(ctx, (payload as { studioId: string }).studioId)
    },
    [REFUND_TASK]: async (payload) => {
      await makeRefund(ctx, payload as { requestId: string; amountCents: number; reason: string; key: string })
    },
    [KEEP_CARD_TASK]: async (payload) => {
      await keepCard(ctx, payload as { requestId: string; paymentIntentId: string })
    },
    [OPEN_CHECKOUT_TASK]: async (payload) => {
      const { requestId, purpose, amountCents } = payload as { requestId: string; purpose: 'deposit' | 'balance'; amountCents: number }
      // The request may have moved on (withdrawn, paid) before the job ran.
      const { state } = await ctx.db.getRepository(FiringRequest).findOneByOrFail({ id: requestId })
      if ((purpose === 'deposit' && state === 'accepted') || (purpose === 'balance' && state === 'ready'))
        await openCheckout(ctx, requestId, purpose, amountCents)
    },
    [DEPOSIT_EXPIRY_TASK]: async (payload) => {
      const { requestId } = payload as { requestId: string }
      if (await expireDepositHold(ctx, requestId)) await expireOpenCheckouts(ctx, requestId)
    },
    [EXPIRE_CHECKOUTS_TASK]: async (payload) => {
      await expireOpenCheckouts(ctx, (payload as { requestId: string }).requestId)
    },
    [PAYOUT_TASK]: async (payload) => {
      await payStudio(ctx, (payload as { requestId: string }).requestId)
    },
    [PAYOUT_SWEEP_TASK]: async () => {
      const queued = await sweepPayouts(ctx)
      if (queued) ctx.log.info(`payout sweep: ${queued} requests queued for a payout run`)
    },
    [REQUEST_SWEEP_TASK]: async () => {
      const lapsed = await sweepStaleRequests(ctx)
      if (lapsed) ctx.log.info(`request sweep: ${lapsed} stale requests lapsed`)
    },
    [MESSAGE_DIGEST_TASK]: async (payload) => {
      const { requestId, to } = payload as { requestId: string; to: 'potter' | 'studio' }
      await sendMessageDigest(ctx, requestId, to)
    },
    [PROCESS_PHOTO_TASK]: async (payload) => {
      await processPhoto(ctx, (payload as { photoId: string }).photoId)
    },
    [PUBLISH_REVIEWS_TASK]: async (payload) => {
      await publishDueReviews(ctx, (payload as { requestId: string }).requestId)
    },
    [REINDEX_TASK]: async () => {
      const { documents } = await reindexAll(ctx)
      ctx.log.info(`search index rebuilt: ${documents} open firings`)
      engineRebuilt()
    },
  }
}
