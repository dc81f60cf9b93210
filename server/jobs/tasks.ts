import type { TaskList } from 'graphile-worker'
import type { AppContext } from '../context'
import { sendQueuedMail } from '../services/mail'

/** Every background task by name. Handlers are thin: the work lives in services. */
export function taskList(ctx: AppContext): TaskList {
  return {
    'send-mail': async (payload) => {
      await sendQueuedMail(ctx, (payload as { mailId: string }).mailId)
    },
  }
}
