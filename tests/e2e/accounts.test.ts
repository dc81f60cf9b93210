// In a real browser against the real server: registration with e-mail verification, sign-in to the
// right home per role, a wrong password, and a password reset through the caught mail.
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, openPage } from '../support/browser'
import { linkIn, waitForMail } from '../support/mailbox'
import { startTestApp, type TestApp } from '../support/test-app'

let app: TestApp
let browser: Browser
const PASSWORD = 'brushed-shino-over-iron-slip'

beforeAll(async () => {
  app = await startTestApp({ mail: true, serveClient: true })
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
  await app?.close()
})

const newPage = () => openPage(browser, app.url)

async function registerThroughForm(page: Page, { email, name, role }: { email: string; name: string; role: 'potter' | 'host' }) {
  await page.goto('/join')
  await page.getByText(role === 'potter' ? 'I bring ware' : 'I fire kilns').click()
  await page.getByLabel('Your name').fill(name)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Make my account' }).click()
}

async function signInThroughForm(page: Page, email: string, password: string) {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

describe('accounts in the browser', () => {
  it('a new potter registers, confirms the address from the mail, signs out and back in to the potter home', async () => {
    const { page, errors } = await newPage()
    const email = `hazel.${Date.now()}@example.test`
    await registerThroughForm(page, { email, name: 'Hazel Quist', role: 'potter' })
    await page.waitForURL('**/my-ware')
    await page.getByText('we mailed a link to').waitFor()

    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'Confirm' })
    await page.goto(linkIn(mail, '/verify-email'))
    await page.getByText('Address confirmed').waitFor()

    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL('**/sign-in')
    await signInThroughForm(page, email, PASSWORD)
    await page.waitForURL('**/my-ware')
    await page.getByRole('heading', { name: 'My ware' }).waitFor()
    expect(await page.getByText('we mailed a link to').count()).toBe(0)
    expect(await page.getByTestId('signed-in-as').textContent()).toBe('Hazel Quist')
    expect(errors).toEqual([])
  })

  it('a studio owner lands in the kiln room', async () => {
    const { page, errors } = await newPage()
    const email = `ivo.${Date.now()}@example.test`
    await registerThroughForm(page, { email, name: 'Ivo Brandt', role: 'host' })
    await page.waitForURL('**/kiln-room')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL('**/sign-in')
    await signInThroughForm(page, email, PASSWORD)
    await page.waitForURL('**/kiln-room')
    await page.getByRole('heading', { name: 'Kiln room' }).waitFor()
    expect(errors).toEqual([])
  })

  it('a wrong password shows an error on the form and signs nobody in', async () => {
    const { page, errors } = await newPage()
    const email = `wrongpw.${Date.now()}@example.test`
    await registerThroughForm(page, { email, name: 'Odile Park', role: 'potter' })
    await page.waitForURL('**/my-ware')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL('**/sign-in')
    await signInThroughForm(page, email, 'not-my-password-at-all')
    const alert = page.getByRole('alert').filter({ hasText: 'do not match' })
    await alert.waitFor()
    expect(page.url()).toContain('/sign-in')
    expect(errors).toEqual([])
  })

  it('a password reset mail sets a new password that works, and the old one no longer does', async () => {
    const { page, errors } = await newPage()
    const email = `reset.${Date.now()}@example.test`
    await registerThroughForm(page, { email, name: 'Pia Lund', role: 'potter' })
    await page.waitForURL('**/my-ware')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL('**/sign-in')

    const askedAt = new Date()
    await page.getByRole('link', { name: 'Forgot your password?' }).click()
    // The sign-in page's own E-mail field stays until the reset page's code has loaded: wait for that page.
    const mailMe = page.getByRole('button', { name: 'Mail me a link' })
    await mailMe.waitFor()
    await page.getByLabel('E-mail').fill(email)
    await mailMe.click()
    await page.getByText('Check your mail').waitFor()

    const mail = await waitForMail(app.mail!.webUrl, { to: email, subject: 'new Conewright password', after: askedAt })
    await page.goto(linkIn(mail, '/reset-password'))
    const newPassword = 'wadding-between-the-bricks'
    await page.getByLabel('New password').fill(newPassword)
    await page.getByRole('button', { name: 'Set password' }).click()
    await page.getByText('Password changed').waitFor()

    await signInThroughForm(page, email, PASSWORD)
    await page.getByRole('alert').filter({ hasText: 'do not match' }).waitFor()
    await signInThroughForm(page, email, newPassword)
    await page.waitForURL('**/my-ware')
    expect(errors).toEqual([])
  })
})
