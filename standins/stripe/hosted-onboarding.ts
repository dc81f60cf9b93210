// The hosted onboarding page an account link's `url` points at: a plain form, clearly marked as a
// local test page, that takes the test values of Stripe's Connect testing guide (see
// ONBOARDING_TEST_VALUES). Submitting it updates the account the way Stripe's onboarding does, raises
// `account.updated`, and sends the person to the link's `return_url`. A used or expired link sends
// them to its `refresh_url`, where the platform makes a fresh one.
//
// Form contract (for tests driving it without a browser): POST /connect/onboarding/:token,
// urlencoded, fields businessType, firstName, lastName, dob (YYYY-MM-DD), ssnLast4, addressLine1,
// postalCode, routingNumber, accountNumber, tosAccepted ("on"); or `document` when only an identity
// document is still due. Answers 303 to the return URL, or 400 with the page and its error.
import express, { type Request, type Response, type Router } from 'express'
import { ONBOARDING_TEST_VALUES, type ConnectBook, type OnboardingForm } from './connect'
import type { AccountObject } from './objects'
import { escapeHtml, testPage } from './test-page'

export const ONBOARDING_PAGE_PATH = '/connect/onboarding'

const BANNER = 'Local test onboarding page (Stripe stand-in). Use the test values below; nothing is checked with anyone.'

function field(name: keyof OnboardingForm, label: string, value: string, attributes = ''): string {
  return `<label for="${name}">${escapeHtml(label)}</label>
<input id="${name}" name="${name}" value="${escapeHtml(value)}" ${attributes}>`
}

const TEST_VALUES_HELP = `<details open>
<summary>Test values</summary>
<p>Date of birth <code>${ONBOARDING_TEST_VALUES.dobVerified}</code> is verified; <code>${ONBOARDING_TEST_VALUES.dobRejected}</code>
is refused; any other date asks for an identity document afterwards (<code>${ONBOARDING_TEST_VALUES.documentVerified}</code>
verifies it, <code>${ONBOARDING_TEST_VALUES.documentFailed}</code> fails).</p>
<p>Bank: routing <code>${ONBOARDING_TEST_VALUES.routingNumber}</code>, account <code>${ONBOARDING_TEST_VALUES.accountNumber}</code>
(<code>${ONBOARDING_TEST_VALUES.closedAccountNumber}</code> is a closed account: its payouts fail). Any 4 digits of SSN.</p>
</details>`

function renderEverything(account: AccountObject, form: Partial<OnboardingForm>, error: string | null): string {
  const name = account.business_profile?.name ?? 'your business'
  return testPage(
    'Set up payouts',
    BANNER,
    `<div class="panel">
<h1>Get paid for ${escapeHtml(name)}</h1>
<p>Tell us who you are and where to send your money.</p>
${error ? `<div class="error" role="alert">${escapeHtml(error)}</div>` : ''}
<form method="post" novalidate>
<label for="businessType">Business type</label>
<select id="businessType" name="businessType">
<option value="individual"${form.businessType === 'company' ? '' : ' selected'}>Individual or sole proprietor</option>
<option value="company"${form.businessType === 'company' ? ' selected' : ''}>Company</option>
</select>
<div class="row">
<div>${field('firstName', 'Legal first name', form.firstName ?? '', 'autocomplete="given-name" required')}</div>
<div>${field('lastName', 'Legal last name', form.lastName ?? '', 'autocomplete="family-name" required')}</div>
</div>
${field('dob', 'Date of birth (YYYY-MM-DD)', form.dob ?? '', 'placeholder="YYYY-MM-DD" required')}
${field('ssnLast4', 'Last 4 digits of SSN', form.ssnLast4 ?? '', 'inputmode="numeric" maxlength="4" required')}
${field('addressLine1', 'Street address', form.addressLine1 ?? '', 'autocomplete="address-line1" required')}
${field('postalCode', 'ZIP code', form.postalCode ?? '', 'autocomplete="postal-code" inputmode="numeric" required')}
<div class="row">
<div>${field('routingNumber', 'Routing number', form.routingNumber ?? '', 'inputmode="numeric" required')}</div>
<div>${field('accountNumber', 'Account number', form.accountNumber ?? '', 'inputmode="numeric" required')}</div>
</div>
<label class="check"><input type="checkbox" id="tosAccepted" name="tosAccepted"${form.tosAccepted ? ' checked' : ''}>
<span>I agree to the connected account services agreement.</span></label>
<button type="submit">Agree and submit</button>
</form>
${TEST_VALUES_HELP}
</div>`,
  )
}

function renderDocument(account: AccountObject, form: Partial<OnboardingForm>, error: string | null): string {
  const failed = account.requirements?.errors?.[0]?.reason
  return testPage(
    'Verify your identity',
    BANNER,
    `<div class="panel">
<h1>One more thing: an identity document</h1>
<p>We could not verify your identity from the details you gave. Provide a photo of an identity document.</p>
${failed ? `<div class="error" role="alert">${escapeHtml(failed)}</div>` : ''}
${error ? `<div class="error" role="alert">${escapeHtml(error)}</div>` : ''}
<form method="post" novalidate>
${field('document', 'Identity document (test file token)', form.document ?? '', 'required')}
<button type="submit">Submit</button>
</form>
${TEST_VALUES_HELP}
</div>`,
  )
}

function renderNothingDue(returnUrl: string): string {
  return testPage(
    'All set',
    BANNER,
    `<div class="panel"><div class="done" role="status">Nothing more is needed right now.</div><a class="cancel" href="${escapeHtml(returnUrl)}">Return</a></div>`,
  )
}

function readForm(body: unknown, req: Request): OnboardingForm {
  const source = (typeof body === 'object' && body !== null ? body : {}) as Record<string, unknown>
  const text = (name: string) => (typeof source[name] === 'string' ? (source[name] as string).trim() : '')
  return {
    businessType: text('businessType'),
    firstName: text('firstName'),
    lastName: text('lastName'),
    dob: text('dob'),
    ssnLast4: text('ssnLast4'),
    addressLine1: text('addressLine1'),
    postalCode: text('postalCode'),
    routingNumber: text('routingNumber').replace(/\s/g, ''),
    accountNumber: text('accountNumber').replace(/\s/g, ''),
    tosAccepted: text('tosAccepted') === 'on' || text('tosAccepted') === 'true',
    document: text('document'),
    ip: req.ip ?? '127.0.0.1',
    userAgent: req.get('user-agent') ?? '',
  }
}

export function createHostedOnboardingRouter(connect: ConnectBook, onChange: () => void): Router {
  const router = express.Router()
  router.use(express.urlencoded({ extended: false, limit: '16kb' }))

  const open = (req: Request, res: Response) => {
    const opened = connect.openLink(String(req.params.token))
    if ('gone' in opened) {
      if (opened.gone) res.redirect(303, opened.gone)
      else
        res
          .status(404)
          .type('html')
          .send(
            testPage(
              'Link not found',
              BANNER,
              '<div class="panel"><h1>Link not found</h1><p>There is no onboarding link at this address.</p></div>',
            ),
          )
      return null
    }
    return opened
  }

  router.get('/:token', (req, res) => {
    const opened = open(req, res)
    if (!opened) return
    const asks = connect.asksFor(opened.account)
    const html =
      asks === 'everything'
        ? renderEverything(opened.account, {}, null)
        : asks === 'document'
          ? renderDocument(opened.account, {}, null)
          : renderNothingDue(opened.link.returnUrl)
    res.status(200).type('html').send(html)
  })

  router.post('/:token', (req, res) => {
    const opened = open(req, res)
    if (!opened) return
    const form = readForm(req.body, req)
    const asks = connect.asksFor(opened.account)
    const outcome = connect.submitOnboarding(String(req.params.token), form)
    onChange()
    if (outcome.ok) {
      res.redirect(303, outcome.returnUrl)
      return
    }
    const html =
      asks === 'document' ? renderDocument(opened.account, form, outcome.message) : renderEverything(opened.account, form, outcome.message)
    res.status(400).type('html').send(html)
  })

  return router
}
