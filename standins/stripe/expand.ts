// The `expand[]` parameter: an id field replaced by the object it names, dotted paths for nested ones
// (`payment_intent.latest_charge`), and Stripe's refusal for a field that cannot be expanded.
import type { TestModeAccount } from './account'
import { invalidRequest } from './errors'

type WireObject = { object: string; id: string } & Record<string, unknown>
type Resolver = (account: TestModeAccount, owner: WireObject) => unknown

const EXPANDABLE: Record<string, Record<string, Resolver>> = {
  'checkout.session': {
    payment_intent: (account, owner) => idOrNull(owner.payment_intent, (id) => account.paymentIntent(id)),
    line_items: (account, owner) => {
      const items = account.lineItems(owner.id)
      return { object: 'list', data: items, has_more: false, url: `/v1/checkout/sessions/${owner.id}/line_items` }
    },
  },
  payment_intent: {
    latest_charge: (account, owner) => idOrNull(owner.latest_charge, (id) => account.charge(id)),
  },
  charge: {
    payment_intent: (account, owner) => idOrNull(owner.payment_intent, (id) => account.paymentIntent(id)),
  },
  refund: {
    charge: (account, owner) => idOrNull(owner.charge, (id) => account.charge(id)),
    payment_intent: (account, owner) => idOrNull(owner.payment_intent, (id) => account.paymentIntent(id)),
  },
}

function idOrNull(value: unknown, resolve: (id: string) => unknown): unknown {
  return typeof value === 'string' ? resolve(value) : value
}

function expandPath(account: TestModeAccount, owner: WireObject, segments: string[], fullPath: string): WireObject {
  const [field, ...rest] = segments
  const resolver = EXPANDABLE[owner.object]?.[field]
  if (!resolver) throw invalidRequest(`This property cannot be expanded (${fullPath}).`)
  const current = owner[field]
  const resolved = typeof current === 'object' && current !== null ? current : structuredClone(resolver(account, owner) ?? null)
  const next = rest.length > 0 && resolved !== null ? expandPath(account, resolved as WireObject, rest, fullPath) : resolved
  return { ...owner, [field]: next }
}

// Returns a copy; the stored object keeps its ids.
export function expandObject<T extends object>(account: TestModeAccount, object: T, paths: string[] | undefined): T {
  let expanded = object as unknown as WireObject
  for (const path of paths ?? []) expanded = expandPath(account, expanded, path.split('.'), path)
  return expanded as unknown as T
}
