import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { freePort } from '../../scripts/lib/system.mjs'
import { OutboundMail } from '../../server/entities/OutboundMail'
import { startMailCatcher, type MailCatcher } from '../../standins/mail-catcher'
import { queueMail, sendQueuedMail } from '../../server/services/mail'
import { listMail, waitForMail } from '../support/mailbox'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let catcher: MailCatcher

const content = (subject: string) => ({
  subject,
  paragraphs: ['Your ware is ready for pickup.'],
  details: [['Shelf', 'B2']] as [string, string][],
})

async function jobsFor(mailId: string) {
  return app.ctx.db.query(`SELECT attempts, last_error FROM graphile_worker._private_jobs WHERE payload->>'mailId' = $1`, [mailId])
}

beforeAll(async () => {
  // SMTP points at a closed port first: the outage case.
  app = await startTestApp({ config: { smtpUrl: `smtp://127.0.0.1:${await freePort()}` } })
  catcher = await startMailCatcher({ smtpPort: await freePort(), webPort: await freePort() })
})
afterAll(async () => {
  await app?.close()
  await catcher?.close()
})

describe('the mail queue', () => {
  it('writes nothing when the change that causes the mail rolls back', async () => {
    await expect(
      app.ctx.db.transaction(async (manager) => {
        await queueMail(manager, 'rollback@example.test', 'test', content('Rolled back'))
        throw new Error('the change failed')
      }),
    ).rejects.toThrow('the change failed')
    expect(await app.ctx.db.getRepository(OutboundMail).count({ where: { toAddress: 'rollback@example.test' } })).toBe(0)
    const [{ count }] = await app.ctx.db.query(
      `SELECT count(*)::int AS count FROM graphile_worker.jobs WHERE task_identifier = 'send-mail'`,
    )
    expect(count).toBe(0)
  })

  it('keeps a mail through an SMTP outage and sends it once SMTP is back', async () => {
    const mail = await app.ctx.db.transaction((manager) => queueMail(manager, 'outage@example.test', 'test', content('After the outage')))
    // The worker tries, fails, and records the failure on the mail and the job.
    await expect
      .poll(async () => (await app.ctx.db.getRepository(OutboundMail).findOneByOrFail({ id: mail.id })).attempts, { timeout: 60_000 })
      .toBeGreaterThan(0)
    const failed = await app.ctx.db.getRepository(OutboundMail).findOneByOrFail({ id: mail.id })
    expect(failed.sentAt).toBeNull()
    expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i)
    expect((await jobsFor(mail.id))[0].attempts).toBeGreaterThan(0)

    app.ctx.config.smtpUrl = catcher.smtpUrl
    // Skip the backoff wait rather than sleep through it.
    await app.ctx.db.query(`UPDATE graphile_worker._private_jobs SET run_at = now() WHERE payload->>'mailId' = $1`, [mail.id])
    const caught = await waitForMail(catcher.webUrl, { to: 'outage@example.test', subject: 'After the outage' })
    expect(caught.text).toContain('Your ware is ready for pickup.')
    expect(caught.html).toContain('Your ware is ready for pickup.')
    await expect
      .poll(async () => (await app.ctx.db.getRepository(OutboundMail).findOneByOrFail({ id: mail.id })).sentAt, { timeout: 60_000 })
      .not.toBeNull()
    await expect.poll(async () => (await jobsFor(mail.id)).length, { timeout: 60_000 }).toBe(0)
  })

  it('sends a mail once even when two workers take it at the same moment', async () => {
    app.ctx.config.smtpUrl = catcher.smtpUrl
    const mail = await app.ctx.db.transaction((manager) => queueMail(manager, 'twice@example.test', 'test', content('Only once')))
    await Promise.all([sendQueuedMail(app.ctx, mail.id), sendQueuedMail(app.ctx, mail.id), sendQueuedMail(app.ctx, mail.id)])
    await waitForMail(catcher.webUrl, { to: 'twice@example.test' })
    // Give a straggler time to arrive if one was sent.
    await new Promise((r) => setTimeout(r, 500))
    const caught = (await listMail(catcher.webUrl)).filter((m) => m.to.some((t) => t.address === 'twice@example.test'))
    expect(caught).toHaveLength(1)
  })
})
