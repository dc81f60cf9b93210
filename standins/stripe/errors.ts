// Errors in the shape Stripe's v1 API returns them: `{error: {type, code, message, param}}` with the
// HTTP status that the SDK maps to its error classes (400/404 → StripeInvalidRequestError,
// 401 → StripeAuthenticationError, 402 → StripeCardError, 400 idempotency_error → StripeIdempotencyError).

export type StripeErrorType = 'invalid_request_error' | 'idempotency_error' | 'card_error' | 'api_error'

export interface StripeErrorBody {
  type: StripeErrorType
  message: string
  code?: string
  param?: string
  decline_code?: string
  /** A card error on a PaymentIntent carries the intent as it stands after the attempt. */
  payment_intent?: unknown
  doc_url?: string
}

export class StripeApiError extends Error {
  readonly status: number
  readonly body: StripeErrorBody

  constructor(status: number, body: StripeErrorBody) {
    super(body.message)
    this.status = status
    this.body = body
  }
}

export function invalidRequest(message: string, fields: { code?: string; param?: string } = {}): StripeApiError {
  return new StripeApiError(400, { type: 'invalid_request_error', message, ...fields })
}

// The message and param Stripe uses for an id that does not exist, e.g. "No such checkout.session: 'cs_test_…'".
export function resourceMissing(objectName: string, id: string, param: string): StripeApiError {
  return new StripeApiError(404, {
    type: 'invalid_request_error',
    code: 'resource_missing',
    message: `No such ${objectName}: '${id}'`,
    param,
  })
}
