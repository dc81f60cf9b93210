// Making good in the browser: the studio's owner, on the incident page, promises a hurt neighbour a free
// refire in a coming firing (a refused submit shows its error in the form and keeps what was typed),
// then, once the neighbour has picked up and paid, gives a credit that is refused over what was paid
// and given at a lower amount; the neighbour sees what the studio did on the incident page and on the
// ask's timeline. The section passes axe and fits a phone.
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { formatMoney } from '../../shared/dates'
import { launchBrowser, openSignedIn } from '../support/browser'
import type { HttpSession } from '../support/http-client'
import { checkInAll, fireThrough, moneyQuiet, payBalanceOnline, resultsAndReady } from '../support/money'
import { createPerson, type Person } from '../support/people'
import { readableAtBothWidths } from '../support/readability'
import { mug, sendAndPayDeposit } from '../support/request-fixtures'
import { firingBody, publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const contexts: BrowserContext[] = []
let owner: Person
let potter: Person
let neighbour: Person
let incidentPath = ''
let neighbourRequestId = ''
let neighbourTag = ''

const days = (n: number) => new Date(Date.now() + n * 24 * 3_600_000).toISOString()

async function tagOne(studio: HttpSession, requestId: string) {
  const reply = await studio.post(`/api/requests/${requestId}/pieces`, { pieceIndex: 0, checks: { sound: true, 'clean-foot': true } })
  if (reply.status !== 201) throw new Error(`tag: ${reply.status} ${JSON.stringify(reply.body)}`)
  return reply.body.piece.tag as string
}

beforeAll(async () => {
  app = await startTestApp({ serveClient: true, stripe: true })
  browser = await launchBrowser()
  owner = await createPerson(app, 'host', 'Hedda Ashgrove')
  potter = await createPerson(app, 'potter', 'Bram Thickwall')
  neighbour = await createPerson(app, 'potter', 'Iris Nextshelf')
  const ids = await publishedStudio(owner.session, `Ashgrove Kilns ${Date.now() % 10_000}`)
  const coming = await owner.session.post(
    `/api/kilns/${ids.kilnId}/firings`,
    firingBody({ dropOffBy: days(20), firingDate: days(22), readyBy: days(25) }),
  )
  if (coming.status !== 201) throw new Error(`coming firing: ${coming.status} ${JSON.stringify(coming.body)}`)
  const mine = await sendAndPayDeposit(app, owner.session, potter.session, ids.firingId, [mug({ quantity: 1 })])
  const theirs = await sendAndPayDeposit(app, owner.session, neighbour.session, ids.firingId, [mug({ quantity: 1 })])
  neighbourRequestId = theirs.id
  const potterTag = await tagOne(owner.session, mine.id)
  neighbourTag = await tagOne(owner.session, theirs.id)
  await checkInAll(owner.session, mine.id, [1])
  await checkInAll(owner.session, theirs.id, [1])
  await fireThrough(owner.session, ids.firingId)
  const incident = await owner.session.post(`/api/firings/${ids.firingId}/incidents`, {
    kind: 'blowout',
    shards: true,
    pieceTags: [potterTag],
    hurtTags: [neighbourTag],
  })
  if (incident.status !== 201) throw new Error(`incident: ${incident.status} ${JSON.stringify(incident.body)}`)
  incidentPath = `/incidents/${incident.body.id}`
  // A ceiling for a busy machine: a throwaway database, the server, the stand-in and the browser start here.
}, 300_000)

afterAll(async () => {
  for (const context of contexts) await context.close().catch(() => undefined)
  await browser?.close()
  await app?.close()
})

const signedInPage = async (person: Person) => (await openSignedIn(browser, app.url, contexts, person.email)).page

describe('making good to a hurt potter', () => {
  it('the studio promises a free refire, then credits the neighbour after pickup; the neighbour sees both', async () => {
    const studio = await signedInPage(owner)
    await studio.goto(incidentPath)
    const form = studio.getByRole('form', { name: 'Make good to Iris Nextshelf' })
    // Before pickup a credit waits: the form says why.
    await expect.poll(() => form.getByText('once the potter has picked up the ware').count()).toBe(1)

    await form.getByLabel('Refire free').check()
    await form.getByLabel(new RegExp(neighbourTag)).uncheck()
    await form.getByLabel('In which firing').selectOption({ index: 1 })
    await form.getByLabel('Note for Iris Nextshelf (optional)').fill('Same glaze, on us.')
    await form.getByRole('button', { name: 'Promise the refire' }).click()
    // Refused: no piece chosen. The error shows in the form; the note and the firing stay.
    await expect.poll(() => form.getByRole('alert').first().textContent()).toMatch(/Choose the pieces to refire/)
    expect(await form.getByLabel('Note for Iris Nextshelf (optional)').inputValue()).toBe('Same glaze, on us.')
    expect(await form.getByLabel('In which firing').inputValue()).not.toBe('')
    await form.getByLabel(new RegExp(neighbourTag)).check()
    await form.getByRole('button', { name: 'Promise the refire' }).click()
    await expect.poll(() => studio.getByTestId('remedy').count()).toBe(1)
    expect(await studio.getByTestId('remedy').textContent()).toContain(neighbourTag)
    const { problems, overflow } = await readableAtBothWidths(studio)
    expect(problems).toEqual([])
    expect(overflow).toBeLessThanOrEqual(1)

    // The neighbour picks up and pays; then the studio gives a credit.
    await resultsAndReady(owner.session, neighbourRequestId)
    await payBalanceOnline(app, neighbour.session, neighbourRequestId)
    const picked = await owner.session.post(`/api/requests/${neighbourRequestId}/collected`)
    expect(picked.status).toBe(200)
    await moneyQuiet(app)
    await studio.reload()
    const creditForm = studio.getByRole('form', { name: 'Make good to Iris Nextshelf' })
    const amount = creditForm.getByLabel('Amount to give back (USD)')
    await amount.fill('9999')
    await creditForm.getByRole('button', { name: 'Give the credit' }).click()
    await expect.poll(() => creditForm.getByRole('alert').first().textContent()).toMatch(/At most/)
    expect(await amount.inputValue()).toBe('9999')
    // Half of what the neighbour paid for the mug, in dollars as typed.
    const paid = (await neighbour.session.get(`/api/requests/${neighbourRequestId}`)).body.price.netPaidCents as number
    const half = Math.floor(paid / 2)
    await amount.fill((half / 100).toFixed(2))
    await creditForm.getByRole('button', { name: 'Give the credit' }).click()
    await expect.poll(() => studio.getByTestId('remedy').count()).toBe(2)
    expect(await studio.getByText(`Credit of ${formatMoney(half, 'USD')}`).count()).toBe(1)
    // Both kinds given: nothing more to offer this potter.
    expect(await studio.getByRole('form', { name: 'Make good to Iris Nextshelf' }).count()).toBe(0)

    const hurt = await signedInPage(neighbour)
    await hurt.goto(incidentPath)
    await expect.poll(() => hurt.getByRole('heading', { name: 'What the studio did for your pieces' }).count()).toBe(1)
    await expect.poll(() => hurt.getByTestId('remedy').count()).toBe(2)
    const seen = await readableAtBothWidths(hurt)
    expect(seen.problems).toEqual([])
    expect(seen.overflow).toBeLessThanOrEqual(1)
    await hurt.goto(`/requests/${neighbourRequestId}`)
    await expect.poll(() => hurt.getByText(/Free refire promised for ware hurt in an incident/).count()).toBeGreaterThan(0)
    const madeGood = hurt.getByRole('list', { name: 'Made good by the studio' })
    await expect.poll(() => madeGood.textContent()).toContain(`Refire free: ${neighbourTag}`)
    expect(await madeGood.textContent()).toContain(`Credit of ${formatMoney(half, 'USD')}`)
    await expect
      .poll(() => hurt.getByText(`Credit for ware hurt in an incident: ${formatMoney(half, 'USD')}`, { exact: false }).count())
      .toBeGreaterThan(0)
  })
})
