// The answers each side gives after pickup (shared/reviews.ts): given once through the request door,
// kept from the other side until both have answered or the window closes, then published together.
// The studio's public page, its search ranking and a potter's record read published answers only.
import type { EntityManager } from 'typeorm'
import type { PotterRecordJson, RequestReviewsJson, ReviewJson } from '../../shared/api/requests'
import type { StudioReviewsJson } from '../../shared/api/studios'
import {
  POTTER_QUESTIONS,
  questionsOf,
  reviewWindowClosesAt,
  STUDIO_QUESTIONS,
  summariseFireAgain,
  tally,
  unanswered,
  type ReviewSide,
  type ReviewSummary,
} from '../../shared/reviews'
import type { reviewSchema } from '../../shared/schemas/pickup'
import type { z } from 'zod'
import type { AppContext } from '../context'
import { Review } from '../entities/Review'
import { User } from '../entities/User'
import { HttpError } from '../http/errors'
import { enqueueJob } from '../jobs/queue'
import { reviewGivenMail, reviewsPublishedMail } from '../mail/templates/pickup'
import { factsOf, reviewOpenedAt } from './request-context'
import { requestAction, type ActionStep } from './request-door'
import { enqueueStudioSync } from './search-sync'

export const PUBLISH_REVIEWS_TASK = 'publish-reviews'

export type ReviewBody = z.output<typeof reviewSchema>

/**
 * Gives this side's answers after pickup: the potter's about the studio, the studio's (owner or crew)
 * about the potter. Once per side, final once given. When the other side has answered too, both are
 * published now; otherwise they wait for the other side or for the window to close.
 */
export async function giveReview(ctx: AppContext, user: User, requestId: string, body: ReviewBody, now = new Date()) {
  return requestAction(ctx, user, requestId, 'rate', async (step) => {
    const side: ReviewSide = step.viewer.side === 'potter' ? 'potter' : 'studio'
    const missing = unanswered(side, body)
    if (Object.keys(missing).length) throw new HttpError(400, 'invalid-input', 'Answer each question.', missing)
    const { rc, manager } = step
    const openedAt = (await reviewOpenedAt(manager, requestId)) ?? now
    const closesAt = reviewWindowClosesAt(openedAt)
    const own = Object.fromEntries(questionsOf(side).map((q) => [q.key, body[q.key]!]))
    await manager.getRepository(Review).insert({
      requestId,
      side,
      studioId: rc.studio.id,
      potterId: rc.potter.id,
      authorId: user.id,
      loading: null,
      resultsAsLogged: null,
      turnaround: null,
      communication: null,
      fireAgain: side === 'potter' ? body.fireAgain! : null,
      asDeclared: null,
      cleanAndDry: null,
      onTime: null,
      ...own,
      note: body.note,
      closesAt,
      publishedAt: null,
    })
    await step.note(side === 'potter' ? 'The potter gave their answers after pickup' : 'The studio gave its answers after pickup')
    const other: ReviewSide = side === 'potter' ? 'studio' : 'potter'
    const facts = factsOf(rc, ctx.config.publicUrl)
    if (step.facts.ratedBy[other]) {
      await publish(step, now)
      const mail = reviewsPublishedMail(facts, other, true)
      if (other === 'potter') await step.tellPotter('reviews-published', mail)
      else await step.tellStudio('reviews-published', mail)
    } else {
      await enqueueJob(manager, PUBLISH_REVIEWS_TASK, { requestId }, { runAt: closesAt, jobKey: `publish-reviews:${requestId}` })
      const mail = reviewGivenMail(facts, other, closesAt)
      if (other === 'potter') await step.tellPotter('review-given', mail)
      else await step.tellStudio('review-given', mail)
    }
    return reviewsOfRequest(manager, requestId, side)
  })
}

/** Publishes every answer of the request not yet public, and re-ranks the studio when the potter's is among them. */
async function publish(step: ActionStep, now: Date): Promise<number> {
  const result = await step.manager
    .createQueryBuilder()
    .update(Review)
    .set({ publishedAt: now })
    .where('request_id = :requestId AND published_at IS NULL', { requestId: step.rc.request.id })
    .returning(['side'])
    .execute()
  const rows = result.raw as { side: ReviewSide }[]
  if (rows.some((r) => r.side === 'potter')) await enqueueStudioSync(step.manager, step.rc.studio.id)
  return rows.length
}

/** The queued job at the window's close: whatever has been answered is published, and both sides hear of it. */
export async function publishDueReviews(ctx: AppContext, requestId: string, now = new Date()) {
  return requestAction(ctx, null, requestId, 'publish-reviews', async (step) => {
    const due = await step.manager
      .getRepository(Review)
      .find({ where: { requestId }, select: { id: true, closesAt: true, publishedAt: true } })
    if (!due.some((r) => r.publishedAt === null && r.closesAt.getTime() <= now.getTime())) return 0
    const count = await publish(step, now)
    await step.note('The window for answers closed: the answers given are published')
    const facts = factsOf(step.rc, ctx.config.publicUrl)
    await step.tellPotter('reviews-published', reviewsPublishedMail(facts, 'potter', false))
    await step.tellStudio('reviews-published', reviewsPublishedMail(facts, 'studio', false))
    return count
  })
}

function reviewJson(r: Review): ReviewJson {
  return {
    loading: r.loading,
    resultsAsLogged: r.resultsAsLogged,
    turnaround: r.turnaround,
    communication: r.communication,
    fireAgain: r.fireAgain,
    asDeclared: r.asDeclared,
    cleanAndDry: r.cleanAndDry,
    onTime: r.onTime,
    note: r.note,
    at: r.createdAt.toISOString(),
    publishedAt: r.publishedAt?.toISOString() ?? null,
  }
}

/**
 * The answers on one request as this reader may see them: their own side's always, the other side's
 * only once published. An admin sees what is published.
 */
export async function reviewsOfRequest(
  manager: EntityManager,
  requestId: string,
  reader: ReviewSide | 'admin',
): Promise<RequestReviewsJson> {
  const rows = await manager.getRepository(Review).find({ where: { requestId } })
  const shown = (side: ReviewSide) => {
    const row = rows.find((r) => r.side === side)
    return row && (row.side === reader || row.publishedAt !== null) ? reviewJson(row) : null
  }
  const openedAt = await reviewOpenedAt(manager, requestId)
  return {
    ofStudio: shown('potter'),
    ofPotter: shown('studio'),
    answered: { potter: rows.some((r) => r.side === 'potter'), studio: rows.some((r) => r.side === 'studio') },
    closesAt: openedAt ? reviewWindowClosesAt(openedAt).toISOString() : null,
  }
}

/** Each studio's published answers from potters in brief (count, would fire again, ranking score); studios with none are absent. */
export async function studioReviewSummaries(manager: EntityManager, studioIds: string[]): Promise<Map<string, ReviewSummary>> {
  const result = new Map<string, ReviewSummary>()
  if (!studioIds.length) return result
  const rows: { studio_id: string; fire_again: boolean[] }[] = await manager.query(
    `SELECT studio_id, array_agg(fire_again) AS fire_again FROM reviews
     WHERE side = 'potter' AND published_at IS NOT NULL AND studio_id = ANY($1::uuid[]) GROUP BY studio_id`,
    [studioIds],
  )
  for (const row of rows) {
    const summary = summariseFireAgain(row.fire_again)
    if (summary) result.set(row.studio_id, summary)
  }
  return result
}

/** A studio's public page of answers: the tallies per question, who would fire there again, and the answers themselves. */
export async function studioReviewsPage(manager: EntityManager, studioId: string): Promise<StudioReviewsJson> {
  const published = await manager
    .getRepository(Review)
    .createQueryBuilder('r')
    .where('r.studio_id = :studioId', { studioId })
    .andWhere(`r.side = 'potter'`)
    .andWhere('r.published_at IS NOT NULL')
    .orderBy('r.published_at', 'DESC')
    .getMany()
  const authors = new Map(
    (published.length ? await manager.getRepository(User).findByIds([...new Set(published.map((r) => r.authorId))]) : []).map((u) => [
      u.id,
      u.displayName,
    ]),
  )
  const summary = summariseFireAgain(published.map((r) => r.fireAgain === true))
  return {
    summary: {
      count: published.length,
      fireAgain: summary?.fireAgain ?? 0,
      score: summary ? Math.round(summary.score * 1000) / 1000 : null,
      questions: Object.fromEntries(
        STUDIO_QUESTIONS.map((q) => [q.key, tally(published.map((r) => r[q.key]))]),
      ) as StudioReviewsJson['summary']['questions'],
    },
    reviews: published.slice(0, 100).map((r) => ({
      ...reviewJson(r),
      // A first name is enough in public.
      author: (authors.get(r.authorId) ?? 'A potter').split(' ')[0],
    })),
  }
}

/** What studios said of a potter, published answers only: how many, and the tally for each question. */
export async function potterReviewRecord(manager: EntityManager, potterId: string): Promise<PotterRecordJson['reviews']> {
  const published = await manager
    .getRepository(Review)
    .createQueryBuilder('r')
    .where('r.potter_id = :potterId', { potterId })
    .andWhere(`r.side = 'studio'`)
    .andWhere('r.published_at IS NOT NULL')
    .getMany()
  if (!published.length) return null
  return {
    count: published.length,
    ...(Object.fromEntries(POTTER_QUESTIONS.map((q) => [q.key, tally(published.map((r) => r[q.key]))])) as Omit<
      NonNullable<PotterRecordJson['reviews']>,
      'count'
    >),
  }
}
