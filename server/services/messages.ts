import { IsNull, type EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { RequestMessage } from '../entities/RequestMessage'
import { User } from '../entities/User'
import { enqueueJob } from '../jobs/queue'
import { newMessagesMail } from '../mail/templates/requests'
import { tell } from './notices'
import { factsOf, loadRequest, studioPeople, viewerOf } from './request-context'
import { requestAction } from './request-door'

export const MESSAGE_DIGEST_TASK = 'message-digest'
/** Messages wait this long before the other side is mailed, so a burst becomes one mail. */
export const DIGEST_DELAY_MS = 2 * 60_000

export async function listMessages(ctx: AppContext, user: User, requestId: string) {
  const rc = await loadRequest(ctx.db.manager, requestId)
  await viewerOf(ctx.db.manager, rc, user)
  const messages = await ctx.db.getRepository(RequestMessage).find({ where: { requestId }, order: { createdAt: 'ASC' } })
  const authors = new Map(
    (await ctx.db.getRepository(User).findByIds([...new Set(messages.map((m) => m.authorId))])).map((u) => [u.id, u.displayName]),
  )
  return messages.map((m) => ({
    id: m.id,
    side: m.side,
    author: authors.get(m.authorId) ?? 'Someone',
    body: m.body,
    at: m.createdAt.toISOString(),
    mine: m.authorId === user.id,
  }))
}

/**
 * Adds a message and (re)schedules one digest mail to the other side: the job key is per request and
 * side, so each new message pushes the mail back instead of sending another.
 */
export async function postMessage(ctx: AppContext, user: User, requestId: string, body: string) {
  return requestAction(ctx, user, requestId, 'message', async ({ manager, viewer }) => {
    const side = viewer.side === 'potter' ? 'potter' : 'studio'
    const message = await manager.getRepository(RequestMessage).save({ requestId, authorId: user.id, side, body, notifiedAt: null })
    const to = side === 'potter' ? 'studio' : 'potter'
    await enqueueJob(
      manager,
      MESSAGE_DIGEST_TASK,
      { requestId, to },
      { jobKey: `messages:${requestId}:${to}`, runAt: new Date(Date.now() + DIGEST_DELAY_MS) },
    )
    return { id: message.id, side, body: message.body, at: message.createdAt.toISOString() }
  })
}

/** Mails one side every message it has not been told about yet. */
export async function sendMessageDigest(ctx: AppContext, requestId: string, to: 'potter' | 'studio') {
  await ctx.db.transaction(async (manager: EntityManager) => {
    const from = to === 'potter' ? 'studio' : 'potter'
    const pending = await manager.getRepository(RequestMessage).find({
      where: { requestId, side: from, notifiedAt: IsNull() },
      order: { createdAt: 'ASC' },
      lock: { mode: 'pessimistic_write' },
    })
    if (!pending.length) return
    const rc = await loadRequest(manager, requestId)
    const authors = new Map(
      (await manager.getRepository(User).findByIds([...new Set(pending.map((m) => m.authorId))])).map((u) => [u.id, u.displayName]),
    )
    const content = newMessagesMail(
      factsOf(rc, ctx.config.publicUrl),
      pending.map((m) => ({ author: authors.get(m.authorId) ?? 'Someone', body: m.body })),
    )
    const recipients = to === 'potter' ? [rc.potter] : await studioPeople(manager, rc.studio.id)
    const links = { path: `/requests/${requestId}`, requestId, firingId: rc.firing.id }
    for (const person of recipients) await tell(manager, person, 'new-messages', content, links)
    await manager.getRepository(RequestMessage).update(
      pending.map((m) => m.id),
      { notifiedAt: new Date() },
    )
  })
}
