// Every event the test-mode account raises, kept for `GET /v1/events/:id` and handed to the webhook
// dispatcher. An event about a connected account carries its id in `account`, as Stripe's do, and is
// delivered to the Connect endpoint rather than the platform's.
import { newId, type EventDataObject, type EventObject, type WebhookEventType } from './objects'

/** Which API request caused a change, as an event's `request` field reports it (null for the customer's own actions). */
export interface RequestContext {
  requestId: string | null
  idempotencyKey: string | null
}

export const CUSTOMER_ACTION: RequestContext = { requestId: null, idempotencyKey: null }

export class EventLog {
  private events = new Map<string, EventObject>()

  constructor(
    private readonly options: {
      now: () => number
      apiVersion: () => string | null
      /** Endpoints listening: the platform's, or the Connect endpoint for connected-account events. */
      endpointCount: (connect: boolean) => number
      deliver: (event: EventObject) => void
    },
  ) {}

  // The event carries a snapshot of the object as it was when the change happened, as Stripe's do.
  emit(
    type: WebhookEventType,
    object: EventDataObject,
    context: RequestContext,
    extra: { account?: string; previous?: Record<string, unknown> } = {},
  ): EventObject {
    const event: EventObject = {
      id: newId.event(),
      object: 'event',
      ...(extra.account ? { account: extra.account } : {}),
      api_version: this.options.apiVersion(),
      created: Math.floor(this.options.now() / 1000),
      data: { object: structuredClone(object), ...(extra.previous ? { previous_attributes: structuredClone(extra.previous) } : {}) },
      livemode: false,
      pending_webhooks: this.options.endpointCount(Boolean(extra.account)),
      request: { id: context.requestId, idempotency_key: context.idempotencyKey },
      type,
    }
    this.events.set(event.id, event)
    this.options.deliver(structuredClone(event))
    return event
  }

  get(id: string): EventObject | undefined {
    return this.events.get(id)
  }

  all(): EventObject[] {
    return [...this.events.values()]
  }

  markDelivered(eventId: string): void {
    const event = this.events.get(eventId)
    if (event && event.pending_webhooks > 0) event.pending_webhooks -= 1
  }

  snapshot(): EventObject[] {
    return this.all()
  }

  restore(events: EventObject[]): void {
    this.events = new Map(events.map((event) => [event.id, event]))
  }
}
