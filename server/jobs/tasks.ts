import type { TaskList } from 'graphile-worker'
import { REINDEX_TASK, reindexAll, SYNC_STUDIO_TASK, syncStudio } from '../../search/sync'
import type { AppContext } from '../context'
import { sendQueuedMail } from '../services/mail'
import { engineIsBack } from '../services/search'

/** Every background task by name. Handlers are thin: the work lives in services. */
export function taskList(ctx: AppContext): TaskList {
  return {
    'send-mail': async (payload) => {
      await sendQueuedMail(ctx, (payload as { mailId: string }).mailId)
    },
    [SYNC_STUDIO_TASK]: async (payload) => {
      await syncStudio(ctx, (payload as { studioId: string }).studioId)
      engineIsBack()
    },
    [REINDEX_TASK]: async () => {
      const { documents } = await reindexAll(ctx)
      ctx.log.info(`search index rebuilt: ${documents} open firings`)
      engineIsBack()
    },
  }
}
