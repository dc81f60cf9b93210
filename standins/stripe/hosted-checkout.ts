// The hosted payment page a Checkout Session's `url` points at: a plain server-rendered form, clearly
// marked as a local test page, that takes Stripe's test card numbers. Submitting it confirms the
// session's payment the way Stripe's page does, then sends the customer to `success_url`.
//
// Form contract (for tests driving it without a browser): POST /checkout/:sessionId, urlencoded, fields
// email, cardNumber, expiry ("MM / YY"), cvc, cardholderName, postalCode. Answers 303 to the success URL
// on success, 402 with the page and its error on a decline, 400 for a card number or field the form refuses.
import express, { type Request, type Response, type Router } from 'express'
import type { CustomerEntry, TestModeAccount } from './account'
import { formatAmount } from './currency'
import { StripeApiError } from './errors'
import type { LineItemObject, SessionObject } from './objects'
import { checkCardEntry, type CardEntry } from './test-cards'
import { escapeHtml, testPage } from './test-page'

export const CHECKOUT_PAGE_PATH = '/checkout'

interface FormState {
  email: string
  cardNumber: string
  expiry: string
  cvc: string
  cardholderName: string
  postalCode: string
}

const EMPTY_FORM: FormState = { email: '', cardNumber: '', expiry: '', cvc: '', cardholderName: '', postalCode: '' }

function page(title: string, body: string): string {
  return testPage(title, 'Local test payment page (Stripe stand-in). No card is charged and no money moves.', body)
}

function submitLabel(session: SessionObject): string {
  const amount = formatAmount(session.amount_total ?? 0, session.currency ?? 'usd')
  if (session.submit_type === 'book') return `Book · ${amount}`
  if (session.submit_type === 'donate') return `Donate ${amount}`
  return `Pay ${amount}`
}

function field(name: keyof FormState, label: string, value: string, attributes: string): string {
  return `<label for="${name}">${escapeHtml(label)}</label>
<input id="${name}" name="${name}" value="${escapeHtml(value)}" ${attributes}>`
}

interface Presets {
  email: string | null
  keepsCard: boolean
}

function renderCheckout(
  session: SessionObject,
  lineItems: LineItemObject[],
  presets: Presets,
  form: FormState,
  error: string | null,
): string {
  const currency = session.currency ?? 'usd'
  const lines = lineItems
    .map(
      (item) =>
        `<li><span>${escapeHtml(item.description ?? '')}${item.quantity && item.quantity > 1 ? ` × ${item.quantity}` : ''}</span>` +
        `<span>${escapeHtml(formatAmount(item.amount_total, currency))}</span></li>`,
    )
    .join('')
  const email = presets.email ?? form.email
  const emailAttributes = presets.email ? 'type="email" autocomplete="email" readonly' : 'type="email" autocomplete="email" required'
  const cancel = session.cancel_url ? `<a class="cancel" href="${escapeHtml(session.cancel_url)}">Cancel and go back</a>` : ''
  return page(
    'Pay',
    `<div class="panel">
<h1>Checkout</h1>
<ul class="lines">${lines}</ul>
<div class="total"><span>Total due</span><span data-testid="total">${escapeHtml(formatAmount(session.amount_total ?? 0, currency))}</span></div>
${presets.keepsCard ? '<p data-testid="keeps-card">The seller keeps this card for later payments under its terms.</p>' : ''}
${error ? `<div class="error" role="alert">${escapeHtml(error)}</div>` : ''}
<form method="post" novalidate>
${field('email', 'Email', email, emailAttributes)}
${field('cardNumber', 'Card number', form.cardNumber, 'inputmode="numeric" autocomplete="cc-number" placeholder="1234 1234 1234 1234" required')}
<div class="row">
<div>${field('expiry', 'Expiry (MM / YY)', form.expiry, 'inputmode="numeric" autocomplete="cc-exp" placeholder="MM / YY" required')}</div>
<div>${field('cvc', 'CVC', form.cvc, 'inputmode="numeric" autocomplete="cc-csc" placeholder="123" required')}</div>
</div>
${field('cardholderName', 'Name on card', form.cardholderName, 'autocomplete="cc-name"')}
${field('postalCode', 'Postal code', form.postalCode, 'autocomplete="postal-code" required')}
<button type="submit">${escapeHtml(submitLabel(session))}</button>
</form>
${cancel}
<details>
<summary>Test cards</summary>
<p><code>4242 4242 4242 4242</code> succeeds; <code>4000 0000 0000 0002</code> is declined;
<code>4000 0000 0000 9995</code> is declined for insufficient funds; <code>4000 0027 6000 3184</code> pays here
but cannot be charged later without the cardholder. Any future expiry, any 3-digit CVC.</p>
</details>
</div>`,
  )
}

function renderNotice(title: string, message: string, link: { href: string; text: string } | null): string {
  const anchor = link ? `<a class="cancel" href="${escapeHtml(link.href)}">${escapeHtml(link.text)}</a>` : ''
  return page(title, `<div class="panel"><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p>${anchor}</div>`)
}

// Stripe fills the `{CHECKOUT_SESSION_ID}` template in success_url with the session's id.
export function successRedirect(session: SessionObject): string | null {
  return session.success_url ? session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id) : null
}

function readForm(body: unknown): FormState {
  const source = (typeof body === 'object' && body !== null ? body : {}) as Record<string, unknown>
  const text = (name: keyof FormState) => (typeof source[name] === 'string' ? (source[name] as string) : '')
  return {
    email: text('email').trim(),
    cardNumber: text('cardNumber'),
    expiry: text('expiry'),
    cvc: text('cvc'),
    cardholderName: text('cardholderName').trim(),
    postalCode: text('postalCode').trim(),
  }
}

const EMAIL_PATTERN = /^[^\s@]+@[^\s@]+\.[^\s@]+$/

export function createHostedCheckoutRouter(account: TestModeAccount, now: () => number, onChange: () => void = () => {}): Router {
  const router = express.Router()
  router.use(express.urlencoded({ extended: false, limit: '16kb' }))

  // Loads the session or answers for a session that cannot take a payment; null means "already answered".
  const openSession = (req: Request, res: Response): SessionObject | null => {
    let session: SessionObject
    try {
      session = account.session(String(req.params.id))
    } catch (error) {
      if (!(error instanceof StripeApiError)) throw error
      res
        .status(404)
        .type('html')
        .send(renderNotice('Checkout not found', 'There is no checkout session at this address.', null))
      return null
    }
    if (session.status === 'complete') {
      const target = successRedirect(session)
      if (target) res.redirect(303, target)
      else
        res
          .status(200)
          .type('html')
          .send(renderNotice('Payment complete', 'This checkout session has been paid.', null))
      return null
    }
    if (session.status === 'expired') {
      const back = session.cancel_url ? { href: session.cancel_url, text: 'Go back' } : null
      res
        .status(410)
        .type('html')
        .send(renderNotice('Checkout expired', 'This checkout session has expired. No payment was taken.', back))
      return null
    }
    return session
  }

  router.get('/:id', (req, res) => {
    const session = openSession(req, res)
    if (!session) return
    res
      .status(200)
      .type('html')
      .send(renderCheckout(session, account.lineItems(session.id), account.checkoutPresets(session.id), EMPTY_FORM, null))
  })

  router.post('/:id', (req, res) => {
    const session = openSession(req, res)
    if (!session) return
    const form = readForm(req.body)
    const lineItems = account.lineItems(session.id)
    const presets = account.checkoutPresets(session.id)
    const refuse = (status: number, message: string) =>
      res
        .status(status)
        .type('html')
        .send(renderCheckout(session, lineItems, presets, form, message))

    const email = presets.email ?? form.email
    if (!EMAIL_PATTERN.test(email)) {
      refuse(400, 'Your email address is incomplete.')
      return
    }
    const entry: CardEntry = { number: form.cardNumber, expiry: form.expiry, cvc: form.cvc, postalCode: form.postalCode }
    const checked = checkCardEntry(entry, new Date(now()))
    if (!checked.ok) {
      refuse(400, checked.message)
      return
    }
    const customer: CustomerEntry = { email, name: form.cardholderName, postalCode: form.postalCode }
    const attempt = account.payCheckoutSession(session.id, checked.card, customer)
    onChange()
    if (attempt.result === 'declined') {
      refuse(402, `${attempt.message} Try another card.`)
      return
    }
    const target = successRedirect(attempt.session)
    if (target) res.redirect(303, target)
    else
      res
        .status(200)
        .type('html')
        .send(renderNotice('Payment complete', 'Thank you, your payment went through.', null))
  })

  return router
}
