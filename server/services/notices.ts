// Telling people: every change that involves money or the other side writes an in-app notice and
// queues the same words as mail, in the caller's transaction. The notice list is how the board is
// worked without reading mail; the mail is for when nobody is looking at the board.
import { In, IsNull, type EntityManager } from 'typeorm'
import type { NoticeJson, NoticeList } from '../../shared/api/notices'
import { Notice } from '../entities/Notice'
import type { User } from '../entities/User'
import type { JobOptions } from '../jobs/queue'
import type { MailContent } from '../mail/render'
import { queueMail } from './mail'

export interface NoticeLinks {
  /** The app path the notice opens, e.g. /requests/<id>. */
  path: string
  requestId?: string | null
  firingId?: string | null
  firingEventId?: string | null
}

/**
 * Tells one person of a change: a notice (the mail's subject and first paragraph) and the mail itself.
 * `mail.runAt`/`jobKey` hold the mail back, e.g. until a stage move can no longer be undone.
 */
export async function tell(
  manager: EntityManager,
  person: Pick<User, 'id' | 'email'>,
  kind: string,
  content: MailContent,
  links: NoticeLinks,
  mail: Pick<JobOptions, 'runAt' | 'jobKey'> | false = {},
) {
  await manager.getRepository(Notice).insert({
    userId: person.id,
    kind,
    title: content.subject,
    body: content.paragraphs[0] ?? '',
    path: links.path,
    requestId: links.requestId ?? null,
    firingId: links.firingId ?? null,
    firingEventId: links.firingEventId ?? null,
    readAt: null,
  })
  if (mail === false) return null
  return (await queueMail(manager, person.email, kind, content, mail)).id
}

const noticeJson = (n: Notice): NoticeJson => ({
  id: n.id,
  kind: n.kind,
  title: n.title,
  body: n.body,
  path: n.path,
  read: n.readAt !== null,
  at: n.createdAt.toISOString(),
})

/** A person's notices, newest first, with the count of unread ones. */
export async function listNotices(manager: EntityManager, userId: string, limit = 50): Promise<NoticeList> {
  const repo = manager.getRepository(Notice)
  const [items, unread] = await Promise.all([
    repo.find({ where: { userId }, order: { createdAt: 'DESC' }, take: limit }),
    repo.count({ where: { userId, readAt: IsNull() } }),
  ])
  return { items: items.map(noticeJson), unread }
}

export async function markNoticesRead(manager: EntityManager, userId: string, which: { ids: string[] } | { all: true }) {
  const where = 'all' in which ? { userId, readAt: IsNull() } : { userId, readAt: IsNull(), id: In(which.ids) }
  await manager.getRepository(Notice).update(where, { readAt: new Date() })
  return listNotices(manager, userId)
}

/** Takes back the notices a stage move wrote (its undo). */
export async function withdrawNotices(manager: EntityManager, firingEventId: string) {
  await manager.getRepository(Notice).delete({ firingEventId })
}
