// Webhook delivery as Stripe does it: the event JSON POSTed to the endpoint, signed in the
// `Stripe-Signature` header, retried with exponential backoff until the endpoint answers 2xx.
// Deliveries run in the background so an API call never waits on the app's webhook handler.
import { createHmac } from 'node:crypto'
import type { EventObject, WebhookEventType } from './objects'

export interface WebhookRetryPolicy {
  /** Delay before the first retry; each later retry waits twice as long. */
  baseDelayMs: number
  /** Attempts in all, the first included. */
  maxAttempts: number
  /** How long one attempt may take before it counts as failed. */
  timeoutMs: number
}

export const DEFAULT_RETRY_POLICY: WebhookRetryPolicy = { baseDelayMs: 200, maxAttempts: 8, timeoutMs: 5_000 }

export interface DeliveryAttempt {
  at: number
  /** HTTP status the endpoint answered, or null when it could not be reached in time. */
  status: number | null
  error?: string
}

export interface WebhookDelivery {
  eventId: string
  type: WebhookEventType
  url: string
  status: 'pending' | 'delivered' | 'failed'
  attempts: DeliveryAttempt[]
}

// Stripe's scheme: v1 = hex HMAC-SHA256 of `${timestamp}.${payload}` keyed with the endpoint secret.
export function signatureHeader(payload: string, secret: string, timestamp: number): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex')
  return `t=${timestamp},v1=${signature}`
}

export class WebhookDispatcher {
  private url: string | undefined
  private readonly secret: string
  // Events about connected accounts go to the platform's Connect endpoint, which has its own secret.
  private connectUrl: string | undefined
  private readonly connectSecret: string
  private readonly policy: WebhookRetryPolicy
  private readonly onSettled: (eventId: string, delivered: boolean) => void
  private readonly log: WebhookDelivery[] = []
  private readonly running = new Set<Promise<void>>()
  private readonly waits = new Map<NodeJS.Timeout, () => void>()
  private readonly controllers = new Set<AbortController>()
  private closed = false

  constructor(options: {
    url: string | undefined
    secret: string
    connectUrl?: string
    connectSecret?: string
    policy: WebhookRetryPolicy
    onSettled: (eventId: string, delivered: boolean) => void
  }) {
    this.url = options.url
    this.secret = options.secret
    this.connectUrl = options.connectUrl
    this.connectSecret = options.connectSecret ?? options.secret
    this.policy = options.policy
    this.onSettled = options.onSettled
  }

  endpointCount(connect: boolean): number {
    return (connect ? this.connectUrl : this.url) ? 1 : 0
  }

  setUrl(url: string): void {
    this.url = url
  }

  setConnectUrl(url: string): void {
    this.connectUrl = url
  }

  deliveries(): WebhookDelivery[] {
    return structuredClone(this.log)
  }

  // Events raised while no endpoint is set are kept (GET /v1/events/:id) but not sent, as with Stripe.
  deliver(event: EventObject): void {
    const url = event.account ? this.connectUrl : this.url
    if (!url || this.closed) return
    const delivery: WebhookDelivery = { eventId: event.id, type: event.type, url, status: 'pending', attempts: [] }
    this.log.push(delivery)
    // Stripe sends the event pretty-printed; an app that re-serialises the parsed body fails the signature.
    const payload = JSON.stringify(event, null, 2)
    const secret = event.account ? this.connectSecret : this.secret
    const run = this.attemptUntilSettled(delivery, payload, secret).finally(() => this.running.delete(run))
    this.running.add(run)
  }

  async idle(): Promise<void> {
    while (this.running.size > 0) await Promise.all([...this.running])
  }

  async close(): Promise<void> {
    this.closed = true
    // A retry waiting for its turn is woken at once and then stops, because the dispatcher is closed.
    for (const [timer, wake] of this.waits) {
      clearTimeout(timer)
      wake()
    }
    this.waits.clear()
    for (const controller of this.controllers) controller.abort()
    await this.idle()
  }

  private async attemptUntilSettled(delivery: WebhookDelivery, payload: string, secret: string): Promise<void> {
    for (let attempt = 1; attempt <= this.policy.maxAttempts; attempt++) {
      if (this.closed) break
      if (await this.attempt(delivery, payload, secret)) {
        delivery.status = 'delivered'
        this.onSettled(delivery.eventId, true)
        return
      }
      if (attempt < this.policy.maxAttempts) await this.wait(this.policy.baseDelayMs * 2 ** (attempt - 1))
    }
    delivery.status = 'failed'
    this.onSettled(delivery.eventId, false)
  }

  private async attempt(delivery: WebhookDelivery, payload: string, secret: string): Promise<boolean> {
    const controller = new AbortController()
    this.controllers.add(controller)
    const timeout = setTimeout(() => controller.abort(), this.policy.timeoutMs)
    // Signed afresh per attempt with the wall clock, which is what the receiver's tolerance check uses.
    const header = signatureHeader(payload, secret, Math.floor(Date.now() / 1000))
    try {
      const response = await fetch(delivery.url, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'Stripe-Signature': header,
          'User-Agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
        },
        body: payload,
        signal: controller.signal,
      })
      await response.arrayBuffer()
      delivery.attempts.push({ at: Date.now(), status: response.status })
      return response.status >= 200 && response.status < 300
    } catch (error) {
      delivery.attempts.push({ at: Date.now(), status: null, error: error instanceof Error ? error.message : String(error) })
      return false
    } finally {
      clearTimeout(timeout)
      this.controllers.delete(controller)
    }
  }

  private wait(ms: number): Promise<void> {
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.waits.delete(timer)
        resolve()
      }, ms)
      this.waits.set(timer, resolve)
    })
  }
}
