import nodemailer, { type Transporter } from 'nodemailer'
import type { EntityManager } from 'typeorm'
import type { AppContext } from '../context'
import { OutboundMail } from '../entities/OutboundMail'
import { enqueueJob, type JobOptions } from '../jobs/queue'
import { renderMail, type MailContent } from '../mail/render'

/** Writes a mail and its send job in the caller's transaction (held back until `runAt` if given). */
export async function queueMail(
  manager: EntityManager,
  to: string,
  template: string,
  content: MailContent,
  options: Pick<JobOptions, 'runAt' | 'jobKey'> = {},
) {
  const rendered = renderMail(content)
  const mail = await manager.getRepository(OutboundMail).save({
    toAddress: to,
    template,
    subject: rendered.subject,
    bodyText: rendered.text,
    bodyHtml: rendered.html,
  })
  await enqueueJob(manager, 'send-mail', { mailId: mail.id }, options)
  return mail
}

let cachedTransport: { url: string; transport: Transporter } | null = null

function transportFor(url: string): Transporter {
  if (cachedTransport?.url !== url) cachedTransport = { url, transport: nodemailer.createTransport(url) }
  return cachedTransport.transport
}

/**
 * Sends one queued mail. The row is locked while sending and stamped in the same transaction, so two
 * workers never both send it; a failure is recorded and rethrown for the queue to retry with backoff.
 */
export async function sendQueuedMail(ctx: AppContext, mailId: string) {
  try {
    await ctx.db.transaction(async (manager) => {
      const mail = await manager
        .getRepository(OutboundMail)
        .createQueryBuilder('mail')
        .setLock('pessimistic_write')
        .where('mail.id = :mailId', { mailId })
        .getOne()
      if (!mail || mail.sentAt) return
      await transportFor(ctx.config.smtpUrl).sendMail({
        from: ctx.config.mailFrom,
        to: mail.toAddress,
        subject: mail.subject,
        text: mail.bodyText,
        html: mail.bodyHtml,
        messageId: `<${mail.id}@conewright.mail>`,
      })
      await manager.update(OutboundMail, mail.id, { sentAt: new Date(), attempts: mail.attempts + 1, lastError: null })
    })
  } catch (error) {
    await ctx.db
      .getRepository(OutboundMail)
      .increment({ id: mailId }, 'attempts', 1)
      .then(() => ctx.db.getRepository(OutboundMail).update(mailId, { lastError: String((error as Error).message ?? error) }))
    throw error
  }
}
