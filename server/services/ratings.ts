import type { EntityManager } from 'typeorm'
import { enqueueStudioSync } from './search-sync'
import { summarise } from '../../shared/ratings'
import type { AppContext } from '../context'
import { Rating } from '../entities/Rating'
import { User } from '../entities/User'
import { conflict, forbidden } from '../http/errors'
import { loadRequest, viewerOf } from './request-context'

/** A rating may be changed for this long after it is first given. */
export const RATING_EDIT_WINDOW_MS = 14 * 24 * 3600_000

/** States after which each side may rate the other: the ware has been handed back. */
const RATEABLE = ['collected', 'disputed']

export interface RatingBody {
  stars: number
  care?: number
  communication?: number
  results?: number
  asDeclared?: number
  onTime?: number
  text: string
}

/**
 * Gives or edits this side's rating of the other side of a collected request: the potter rates the
 * studio, the studio (owner or crew) rates the potter. Once per side; editable for 14 days.
 */
export async function rateRequest(ctx: AppContext, user: User, requestId: string, body: RatingBody, now = new Date()) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, requestId, { lock: true })
    const viewer = await viewerOf(manager, rc, user)
    if (viewer.side === 'admin') throw forbidden('Admins do not rate exchanges.')
    if (!RATEABLE.includes(rc.request.state))
      throw conflict('Ratings open once the ware has been collected.', 'not-collected', { state: rc.request.state })
    const direction = viewer.side === 'potter' ? 'potter-rates-studio' : 'studio-rates-potter'
    const aspects =
      direction === 'potter-rates-studio'
        ? {
            care: body.care ?? null,
            communication: body.communication ?? null,
            results: body.results ?? null,
            asDeclared: null,
            onTime: null,
          }
        : { care: null, communication: null, results: null, asDeclared: body.asDeclared ?? null, onTime: body.onTime ?? null }
    const repo = manager.getRepository(Rating)
    const existing = await repo.findOne({ where: { requestId, direction } })
    if (existing) {
      if (now.getTime() - existing.createdAt.getTime() > RATING_EDIT_WINDOW_MS) {
        throw conflict('A rating can be changed for 14 days after it was given; this one is settled.', 'edit-window-closed')
      }
      await repo.update(existing.id, { stars: body.stars, text: body.text, ...aspects })
    } else {
      await repo.save({
        requestId,
        direction,
        studioId: rc.studio.id,
        potterId: rc.potter.id,
        authorId: user.id,
        stars: body.stars,
        text: body.text,
        ...aspects,
        studioReply: null,
        studioReplyAt: null,
      })
    }
    if (direction === 'potter-rates-studio') await enqueueStudioSync(manager, rc.studio.id)
    return ratingsOfRequest(manager, requestId)
  })
}

/** The studio's one public reply to the potter's rating. */
export async function replyToRating(ctx: AppContext, user: User, requestId: string, text: string) {
  return ctx.db.transaction(async (manager) => {
    const rc = await loadRequest(manager, requestId)
    const viewer = await viewerOf(manager, rc, user)
    if (viewer.side !== 'studio') throw forbidden('Only the studio replies to its rating.')
    const rating = await manager
      .getRepository(Rating)
      .findOne({ where: { requestId, direction: 'potter-rates-studio' }, lock: { mode: 'pessimistic_write' } })
    if (!rating) throw conflict('The potter has not rated this exchange yet.', 'no-rating')
    if (rating.studioReply) throw conflict('The studio has already replied to this rating.', 'already-replied')
    await manager.update(Rating, rating.id, { studioReply: text, studioReplyAt: new Date() })
    return ratingsOfRequest(manager, requestId)
  })
}

export async function ratingsOfRequest(manager: EntityManager, requestId: string) {
  const rows = await manager.getRepository(Rating).find({ where: { requestId } })
  const view = (r: Rating | undefined) =>
    r
      ? {
          stars: r.stars,
          care: r.care,
          communication: r.communication,
          results: r.results,
          asDeclared: r.asDeclared,
          onTime: r.onTime,
          text: r.text,
          reply: r.studioReply,
          at: r.createdAt.toISOString(),
          editableUntil: new Date(r.createdAt.getTime() + RATING_EDIT_WINDOW_MS).toISOString(),
        }
      : null
  return {
    ofStudio: view(rows.find((r) => r.direction === 'potter-rates-studio')),
    ofPotter: view(rows.find((r) => r.direction === 'studio-rates-potter')),
  }
}

/** A studio's public ratings: mean with count, the ranking score, and the ratings themselves. */
export async function studioRatingsPage(manager: EntityManager, studioId: string) {
  const rows = await manager
    .getRepository(Rating)
    .find({ where: { studioId, direction: 'potter-rates-studio' }, order: { createdAt: 'DESC' }, take: 100 })
  const authors = new Map(
    (await manager.getRepository(User).findByIds([...new Set(rows.map((r) => r.authorId))])).map((u) => [u.id, u.displayName]),
  )
  const all: { stars: number }[] = await manager.query(
    `SELECT stars FROM ratings WHERE studio_id = $1 AND direction = 'potter-rates-studio'`,
    [studioId],
  )
  const summary = summarise(all.map((r) => r.stars))
  return {
    summary: summary
      ? { mean: Math.round(summary.mean * 10) / 10, count: summary.count, score: Math.round(summary.score * 100) / 100 }
      : { mean: null, count: 0, score: null },
    ratings: rows.map((r) => ({
      stars: r.stars,
      care: r.care,
      communication: r.communication,
      results: r.results,
      text: r.text,
      // A first name is enough in public.
      author: (authors.get(r.authorId) ?? 'A potter').split(' ')[0],
      reply: r.studioReply,
      at: r.createdAt.toISOString(),
    })),
  }
}
