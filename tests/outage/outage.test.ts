// The outage suite: a running server (queue worker included) under a steady stream of requests while
// PostgreSQL, the search engine and the mail catcher are each stopped and started again. It counts
// the answers by status, the mails and the ledger lines before and after, prints them, and passes
// when nothing was lost or doubled: every invitation answered 202 reaches its inbox once, every
// deposit paid (one during the database outage) is booked once, no answer is a 500, and the search
// engine, restarted empty, is rebuilt and used again. It runs its own PostgreSQL cluster, since it
// stops it.
import { mkdtempSync, rmSync } from 'node:fs'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { throwawayCluster } from '../../scripts/lib/postgres.mjs'
import { freePort } from '../../scripts/lib/system.mjs'
import { createApp } from '../../server/app'
import { loadConfig } from '../../server/config'
import type { AppContext, Logger } from '../../server/context'
import { createDataSource } from '../../server/db/data-source'
import { runWaitingJobsNow } from '../../server/jobs/queue'
import { migrateQueue, startWorker } from '../../server/jobs/worker'
import { startMailCatcher, type MailCatcher } from '../../standins/mail-catcher'
import { startSearchEngine, type RunningSearchEngine } from '../../standins/search-engine/server'
import { startStripeStandIn, type StripeStandIn } from '../../standins/stripe/standin'
import { CARD_SUCCEEDS, submitCard } from '../support/checkout'
import { HttpSession } from '../support/http-client'
import { listMail } from '../support/mailbox'
import { createPerson, type Person } from '../support/people'
import { draftAndSend, mug } from '../support/request-fixtures'
import { publishedStudio } from '../support/studio-fixtures'
import type { TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

const SEARCH_KEY = 'outage-search-key'
const lines: string[] = []
const log: Logger = {
  info: (m) => lines.push(`info ${m}`),
  warn: (m) => lines.push(`warn ${m}`),
  error: (m, e) => lines.push(`error ${m} ${(e as Error)?.message ?? ''}`),
}

let cluster: ReturnType<typeof throwawayCluster>['cluster']
let removeCluster: () => void
let ctx: AppContext
let server: Server
let url: string
let closeApp: () => void
let worker: Awaited<ReturnType<typeof startWorker>>
let mail: MailCatcher
let mailPorts: { smtpPort: number; webPort: number }
let search: RunningSearchEngine
let stripe: StripeStandIn
let storageDir: string
let owner: Person
let potter: Person
let studioId: string
let firingId: string

beforeAll(async () => {
  const throwaway = throwawayCluster(await freePort())
  cluster = throwaway.cluster
  removeCluster = throwaway.remove
  cluster.start()
  const admin = new pg.Client({ connectionString: cluster.url('postgres') })
  await admin.connect()
  await admin.query('CREATE DATABASE outage')
  await admin.end()
  const databaseUrl = cluster.url('outage')

  mailPorts = { smtpPort: await freePort(), webPort: await freePort() }
  mail = await startMailCatcher(mailPorts)
  search = await startSearchEngine({ port: 0, masterKey: SEARCH_KEY })
  stripe = await startStripeStandIn({ port: 0, secretKey: 'sk_test_outage', webhookSecret: 'whsec_outage' })
  storageDir = mkdtempSync(path.join(os.tmpdir(), 'conewright-outage-'))
  const config = loadConfig(
    {},
    {
      databaseUrl,
      smtpUrl: mail.smtpUrl,
      meiliHost: search.url,
      meiliApiKey: SEARCH_KEY,
      stripeSecretKey: 'sk_test_outage',
      stripeWebhookSecret: 'whsec_outage',
      stripeApiBase: stripe.url,
      serveClient: false,
      storageDir,
      workerConcurrency: 2,
      searchProbeMs: 2000,
      rateLimits: { authPerIpPer15Min: 10_000, openApiPerIpPerMin: 100_000 },
    },
  )
  const db = createDataSource(databaseUrl, { poolSize: 10 })
  await db.initialize()
  await db.runMigrations()
  ctx = { config, db, log }
  await migrateQueue(ctx)
  worker = await startWorker(ctx)
  const created = createApp(ctx)
  closeApp = created.close
  server = await new Promise((resolve) => {
    const s = created.app.listen(0, '127.0.0.1', () => resolve(s))
  })
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  config.publicUrl = url
  stripe.setWebhookUrl(`${url}/api/webhooks/stripe`)

  const asTestApp = { url, ctx } as unknown as TestApp
  owner = await createPerson(asTestApp, 'host', 'Outage Owner')
  potter = await createPerson(asTestApp, 'potter', 'Outage Potter')
  ;({ studioId, firingId } = await publishedStudio(owner.session, 'Outage Pottery'))
}, 180_000)

afterAll(async () => {
  server?.closeAllConnections()
  server?.close()
  await worker?.stop()
  closeApp?.()
  await ctx?.db.destroy()
  await mail?.close()
  await search?.close()
  await stripe?.close()
  cluster?.stop()
  removeCluster?.()
  if (storageDir) rmSync(storageDir, { recursive: true, force: true })
})

// ---------------------------------------------------------------------------------------------------

type Phase = 'before' | 'database down' | 'search down' | 'mail down' | 'after'
const answers = new Map<Phase, Map<number, number>>()
let phase: Phase = 'before'
const invited: string[] = []
let streaming = false
/** Set while the first catcher's inbox is read before it stops, so no mail is in flight then. */
let invitesHeld = false

function count(status: number) {
  const byStatus = answers.get(phase) ?? new Map<number, number>()
  byStatus.set(status, (byStatus.get(status) ?? 0) + 1)
  answers.set(phase, byStatus)
}

/** Requests at a steady pace: a search, the owner's account, the studio page, and now and then an invitation. */
async function stream() {
  let n = 0
  while (streaming) {
    n++
    const anyone = new HttpSession(url)
    const replies = await Promise.all([
      anyone.get('/api/search?perPage=5').catch(() => ({ status: 0 })),
      owner.session.get('/api/auth/me').catch(() => ({ status: 0 })),
      anyone.get(`/api/studios/${studioId}`).catch(() => ({ status: 0 })),
    ])
    replies.forEach((r) => count(r.status))
    // Eighteen invitations at most: one sender's allowance is twenty an hour.
    if (n % 8 === 0 && invited.length < 18 && !invitesHeld) {
      const email = `guest.${invited.length + 1}.${phase.replace(' ', '-')}@example.test`
      const reply = await owner.session.post(`/api/studios/${studioId}/invites`, { email }).catch(() => ({ status: 0 }))
      count(reply.status)
      if (reply.status === 202) invited.push(email)
    }
    await new Promise((r) => setTimeout(r, 100))
  }
}

const health = async () => (await fetch(`${url}/api/health`).catch(() => null))?.status
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms))
const ledgerIn = async () => Number((await ctx.db.query(`SELECT count(*) AS n FROM ledger_entries WHERE direction = 'in'`))[0].n)

let stranded = 0
/**
 * Waits for every queued mail to be sent. The queue backs off between attempts (minutes after a few
 * failures), so the suite runs the waiting mail now, as an operator would after an outage; a job whose
 * worker lost its connection while finishing it stays locked (graphile-worker frees such jobs only
 * after four hours), and the operator's remedy, force_unlock_workers, is applied and counted. The
 * mail's own sent_at keeps a mail from going twice.
 */
async function drainMail(what: string) {
  const locked: { locked_by: string }[] = await ctx.db.query(
    `SELECT DISTINCT locked_by FROM graphile_worker.jobs WHERE locked_at < now() - interval '5 seconds' AND locked_by IS NOT NULL`,
  )
  if (locked.length) await ctx.db.query(`SELECT graphile_worker.force_unlock_workers($1::text[])`, [locked.map((r) => r.locked_by)])
  stranded += locked.length
  await runWaitingJobsNow(ctx.db, 'send-mail')
  await waitUntil(async () => Number((await ctx.db.query(`SELECT count(*) AS n FROM outbound_mail WHERE sent_at IS NULL`))[0].n) === 0, {
    timeout: 120_000,
    interval: 1000,
    what,
  })
}

async function acceptedDeposit(): Promise<{ requestId: string; checkoutUrl: string }> {
  const sent = await draftAndSend(potter.session, firingId, [mug({ quantity: 1 })])
  const accepted = await owner.session.post(`/api/requests/${sent.id}/accept`)
  if (accepted.status !== 200) throw new Error(`accept: ${accepted.status}`)
  const deposit = await potter.session.post(`/api/requests/${sent.id}/deposit`)
  if (deposit.status !== 200) throw new Error(`deposit: ${deposit.status} ${JSON.stringify(deposit.body)}`)
  return { requestId: sent.id, checkoutUrl: deposit.body.checkoutUrl }
}

describe('outages under a stream of requests', () => {
  it('loses nothing and doubles nothing while PostgreSQL, the search engine and the mail catcher go away and come back', async () => {
    const ledgerBefore = await ledgerIn()
    const deposits = [await acceptedDeposit(), await acceptedDeposit()]
    const caught: { to: { address: string }[] }[] = []
    streaming = true
    const running = stream()
    await pause(3000)

    // PostgreSQL stops. A deposit is paid meanwhile: its webhook meets the outage and is retried.
    phase = 'database down'
    cluster.stop()
    expect(await submitCard(deposits[0].checkoutUrl, { cardNumber: CARD_SUCCEEDS })).toMatchObject({ status: 303 })
    await pause(6000)
    const down = await fetch(`${url}/api/auth/me`, { headers: { Cookie: owner.session.cookieHeader() } })
    expect(down.status).toBe(503)
    expect(down.headers.get('retry-after')).toBeTruthy()
    expect((await down.json()).error.code).toBe('database-unavailable')
    cluster.start()
    await waitUntil(async () => (await health()) === 200, { timeout: 60_000, what: 'the database to answer again' })

    // The search engine stops, and comes back empty, as after a restart.
    phase = 'search down'
    const { port } = search
    await search.close()
    await pause(5000)
    search = await startSearchEngine({ port, masterKey: SEARCH_KEY })
    await waitUntil(async () => (await new HttpSession(url).get('/api/search')).body.degraded === false, {
      timeout: 30_000,
      interval: 500,
      what: 'search to leave degraded mode',
    })

    // The mail catcher stops; invitations keep coming; it is started again on the same ports.
    phase = 'mail down'
    invitesHeld = true
    await drainMail('mail in flight to land before the catcher stops')
    caught.push(...(await listMail(mail.webUrl)))
    await mail.close()
    invitesHeld = false
    expect(await submitCard(deposits[1].checkoutUrl, { cardNumber: CARD_SUCCEEDS })).toMatchObject({ status: 303 })
    await pause(6000)
    mail = await startMailCatcher(mailPorts)

    phase = 'after'
    await pause(3000)
    streaming = false
    await running

    // Everything queued goes out, once.
    await drainMail('every queued mail to be sent')
    await stripe.idle()
    await waitUntil(async () => (await ledgerIn()) === ledgerBefore + deposits.length, {
      timeout: 60_000,
      what: 'both deposits in the ledger',
    })
    caught.push(...(await listMail(mail.webUrl)))

    const mailsTo = (address: string) => caught.filter((m) => m.to.some((t) => t.address === address)).length
    const invitesMailed = invited.map(mailsTo)
    const ledgerAfter = await ledgerIn()
    const perRequest: { n: number }[] = await ctx.db.query(
      `SELECT count(*)::int AS n FROM ledger_entries WHERE direction = 'in' AND request_id = ANY($1) GROUP BY request_id`,
      [deposits.map((d) => d.requestId)],
    )
    const finalSearch = (await new HttpSession(url).get('/api/search')).body

    const table = [...answers].map(([p, byStatus]) => `  ${p.padEnd(14)} ${[...byStatus].map(([s, n]) => `${s}×${n}`).join(' ')}`)
    console.log(
      [
        'outage suite',
        'answers by phase and status:',
        ...table,
        `invitations answered 202: ${invited.length}; mails caught for them: ${invitesMailed.reduce((a, b) => a + b, 0)} (each address: ${[...new Set(invitesMailed)].join(', ')})`,
        `ledger lines in: before ${ledgerBefore}, after ${ledgerAfter} (deposits paid during outages: ${deposits.length}; lines per deposit: ${perRequest.map((r) => r.n).join(', ')})`,
        `search after the outages: ${finalSearch.total} firing(s), degraded ${finalSearch.degraded}`,
        `queue workers whose jobs were stranded by the database outage and unlocked: ${stranded}`,
        `log lines about outages:`,
        ...lines.filter((l) => /unreachable|is back/.test(l)).map((l) => `  ${l}`),
        `other warnings and errors: ${lines.filter((l) => /^(warn|error)/.test(l) && !/unreachable|is back/.test(l)).length}`,
        ...[...new Set(lines.filter((l) => /^(warn|error)/.test(l) && !/unreachable|is back/.test(l)).map((l) => l.slice(0, 160)))].map(
          (l) => `  ${l}`,
        ),
      ].join('\n'),
    )

    const all = [...answers.values()].flatMap((m) => [...m])
    expect(all.filter(([s]) => s >= 500 && s !== 503)).toEqual([])
    // 503 only while the database was away.
    expect([...answers].filter(([p, m]) => p !== 'database down' && m.has(503))).toEqual([])
    expect(answers.get('database down')?.get(503)).toBeGreaterThan(0)
    expect(invited.length).toBeGreaterThanOrEqual(4)
    expect(invitesMailed).toEqual(invited.map(() => 1))
    expect(perRequest.map((r) => r.n)).toEqual([1, 1])
    expect(ledgerAfter).toBe(ledgerBefore + deposits.length)
    expect(finalSearch).toMatchObject({ total: 1, degraded: false })
    // One line when each dependency went, one when it was back.
    expect(lines.filter((l) => /the database is unreachable/.test(l))).toHaveLength(1)
    expect(lines.filter((l) => /the database is back/.test(l))).toHaveLength(1)
    expect(lines.filter((l) => /the search engine is unreachable/.test(l)).length).toBeLessThanOrEqual(2)
  }, 400_000)
})
