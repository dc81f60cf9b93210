// Who may do what to a request, and when: one table (state × side → actions) plus the predicates that
// refine it (money owed, a price waiting, a rating given). The server's one door refuses what this
// refuses, the request view lists what this allows, and the client's buttons show exactly that list.
import { takesRequests, type FiringStatus } from './firing-status'
import { holdsSpace, type RequestState } from './request-states'

export const REQUEST_ACTIONS = [
  'edit',
  'send',
  'withdraw',
  'pay-deposit',
  'answer-move',
  'accept',
  'decline',
  'move',
  'cancel',
  'counter-payment',
  'check-in',
  'tag-piece',
  'hold-piece',
  'confirm-price',
  'decline-price',
  'results',
  'ready',
  'pay-balance',
  'collected',
  'rate',
  'reply',
  'dispute',
  'message',
  'hand-back',
] as const
export type RequestAction = (typeof REQUEST_ACTIONS)[number]

/** Actions Conewright itself takes: a paid deposit arriving, a hold or a firing running out, a firing moving. */
export const SYSTEM_ACTIONS = ['deposit-paid', 'balance-paid', 'lapse', 'firing-moved', 'desk-refund'] as const
export type SystemAction = (typeof SYSTEM_ACTIONS)[number]

export type Side = 'potter' | 'studio' | 'admin'

type Table = Record<RequestState, Record<Side, readonly RequestAction[]>>

// After a request ends both sides can still write (about a refund, say), and the studio may still owe
// money taken at its counter: it hands it back.
const ended: Record<Side, readonly RequestAction[]> = { potter: ['message'], studio: ['message', 'hand-back'], admin: [] }

/** What each side may do in each state, before the predicates below narrow it. */
const TABLE: Table = {
  draft: { potter: ['edit', 'send', 'message'], studio: [], admin: [] },
  sent: { potter: ['withdraw', 'answer-move', 'message'], studio: ['accept', 'decline', 'move', 'message'], admin: [] },
  accepted: { potter: ['withdraw', 'pay-deposit', 'message'], studio: ['cancel', 'counter-payment', 'message'], admin: [] },
  deposit_paid: { potter: ['withdraw', 'message'], studio: ['cancel', 'tag-piece', 'hold-piece', 'check-in', 'message'], admin: [] },
  received: { potter: ['confirm-price', 'decline-price', 'message'], studio: ['hold-piece', 'message'], admin: [] },
  fired: { potter: ['dispute', 'message'], studio: ['results', 'ready', 'dispute', 'message'], admin: [] },
  ready: {
    potter: ['pay-balance', 'dispute', 'message'],
    studio: ['results', 'counter-payment', 'collected', 'dispute', 'message'],
    admin: [],
  },
  collected: { potter: ['rate', 'dispute', 'message'], studio: ['rate', 'reply', 'dispute', 'message'], admin: [] },
  disputed: { potter: ['rate', 'message'], studio: ['rate', 'reply', 'message', 'hand-back'], admin: [] },
  declined: ended,
  withdrawn: ended,
  cancelled: ended,
  lapsed: ended,
}

/** The facts about a request (beyond its state) that decide what can be done with it now. */
export interface RequestFacts {
  state: RequestState
  firingStatus: FiringStatus
  /** The deposit asked at acceptance, less what came in toward it. */
  depositOwedCents: number
  /** The standing price less everything paid, once the ware is in the studio's hands. */
  balanceOwedCents: number
  pricePending: boolean
  proposedMove: boolean
  resultsPosted: boolean
  ratedBy: { potter: boolean; studio: boolean }
  /** Whether the studio already answered the potter's rating in public. */
  replied: boolean
  /** Money taken at the counter that the studio owes back and has not yet marked handed back. */
  counterRefundDueCents: number
}

/** Whether the potter owes money now: the deposit before drop-off, the balance once ready. */
export function owesMoney(facts: RequestFacts): boolean {
  if (facts.state === 'accepted') return facts.depositOwedCents > 0
  if (facts.state === 'ready') return facts.balanceOwedCents > 0
  return false
}

/** Whether this side may still rate the other on this request. */
export function canBeRated(facts: RequestFacts, side: Side): boolean {
  if (side === 'admin') return false
  return (facts.state === 'collected' || facts.state === 'disputed') && !facts.ratedBy[side]
}

/** The firing can still take ware in, by the studio's hands (before loading). */
const beforeLoading = (status: FiringStatus) => status === 'open' || status === 'full' || status === 'closed'

const REFINE: Partial<Record<RequestAction, (facts: RequestFacts, side: Side) => boolean>> = {
  accept: (f) => takesRequests(f.firingStatus),
  move: (f) => takesRequests(f.firingStatus),
  'answer-move': (f) => f.proposedMove,
  'pay-deposit': (f) => f.depositOwedCents > 0,
  'counter-payment': (f) => owesMoney(f),
  'check-in': (f) => beforeLoading(f.firingStatus),
  'tag-piece': (f) => beforeLoading(f.firingStatus),
  'hold-piece': (f) => beforeLoading(f.firingStatus),
  'confirm-price': (f) => f.pricePending,
  'decline-price': (f) => f.pricePending,
  ready: (f) => f.resultsPosted,
  'pay-balance': (f) => f.balanceOwedCents > 0,
  collected: (f) => f.balanceOwedCents === 0,
  rate: (f, side) => canBeRated(f, side),
  reply: (f) => f.ratedBy.potter && !f.replied,
  'hand-back': (f) => f.counterRefundDueCents > 0,
}

/** Everything this side may do with the request now, in the table's order. */
export function allowedActions(facts: RequestFacts, side: Side): RequestAction[] {
  return TABLE[facts.state][side].filter((action) => REFINE[action]?.(facts, side) ?? true)
}

/** Whether the side ever does this action, in any state: if not, asking is forbidden, not merely early or late. */
export function sideMayEver(action: RequestAction, side: Side): boolean {
  return Object.values(TABLE).some((row) => row[side].includes(action))
}

export type Refusal = { status: 403 | 409; code: string; message: string }

const ACTION_WORDS: Record<RequestAction, string> = {
  edit: 'change the ware',
  send: 'send the request',
  withdraw: 'withdraw the request',
  'pay-deposit': 'pay the deposit',
  'answer-move': 'answer a proposed move',
  accept: 'take this request on',
  decline: 'decline the request',
  move: 'propose another firing',
  cancel: 'call the request off',
  'counter-payment': 'take a payment at the counter',
  'check-in': 'check the ware in',
  'tag-piece': 'tag a piece at drop-off',
  'hold-piece': 'hold a piece back or take it in again',
  'confirm-price': 'confirm the new price',
  'decline-price': 'turn down the new price',
  results: 'post results',
  ready: 'mark the ware ready',
  'pay-balance': 'pay the balance',
  collected: 'mark the ware collected',
  rate: 'rate this exchange',
  reply: 'reply to the rating',
  dispute: 'raise a dispute',
  message: 'write in the thread',
  'hand-back': 'mark money handed back at the counter',
}

const STATE_WORDS = (state: RequestState) => state.replace('_', ' ')

/** Why a refining predicate said no, for the actions whose "not now" has a better word than the state. */
const NOT_NOW: Partial<Record<RequestAction, (facts: RequestFacts) => Omit<Refusal, 'status'>>> = {
  accept: () => ({ code: 'firing-not-open', message: 'This firing is not taking ware any more.' }),
  move: () => ({ code: 'firing-not-open', message: 'This firing is not taking ware any more.' }),
  'answer-move': () => ({ code: 'no-move', message: 'No move is waiting for an answer.' }),
  'pay-deposit': () => ({ code: 'nothing-owed', message: 'No deposit is owed for this request.' }),
  'pay-balance': () => ({ code: 'nothing-owed', message: 'Nothing is owed.' }),
  'counter-payment': () => ({ code: 'nothing-owed', message: 'Nothing is owed at this point.' }),
  'check-in': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; ware can no longer be checked in.' }),
  'tag-piece': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; pieces can no longer be tagged in.' }),
  'hold-piece': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; a piece can no longer be held back.' }),
  'confirm-price': () => ({ code: 'nothing-to-confirm', message: 'No changed price waits for your answer.' }),
  'decline-price': () => ({ code: 'nothing-to-confirm', message: 'No changed price waits for your answer.' }),
  ready: () => ({ code: 'results-missing', message: 'Post the results first: the potter hears about them with the ready mail.' }),
  collected: (f) => ({
    code: 'balance-owed',
    message: `${(f.balanceOwedCents / 100).toFixed(2)} is still owed. Take it at the counter or let the potter pay online first.`,
  }),
  rate: () => ({ code: 'already-rated', message: 'You have already rated this exchange.' }),
  reply: () => ({ code: 'no-reply-now', message: 'There is no rating to answer, or it is answered already.' }),
  'hand-back': () => ({ code: 'nothing-owed', message: 'No money from the counter is owed back.' }),
}

/** Why the side may not take the action now (null when it may): 403 for the wrong side, 409 for the wrong moment. */
export function refusalOf(action: RequestAction, facts: RequestFacts, side: Side): Refusal | null {
  if (allowedActions(facts, side).includes(action)) return null
  if (!sideMayEver(action, side)) {
    const who = side === 'potter' ? 'the studio' : side === 'studio' ? 'the potter' : 'the potter or the studio'
    const code = side === 'potter' ? 'not-the-studio' : side === 'studio' ? 'not-the-potter' : 'not-your-side'
    return { status: 403, code, message: `Only ${who} can ${ACTION_WORDS[action]}.` }
  }
  if ((action === 'check-in' || action === 'tag-piece') && facts.state === 'accepted') {
    return {
      status: 409,
      code: 'deposit-unpaid',
      message: 'The deposit is not paid yet. Record it at the counter first, or ask the potter to pay it on the request.',
    }
  }
  // Allowed in this state, but a predicate says not now.
  if (TABLE[facts.state][side].includes(action) && NOT_NOW[action]) return { status: 409, ...NOT_NOW[action]!(facts) }
  return {
    status: 409,
    code: 'bad-state-change',
    message: `This request is ${STATE_WORDS(facts.state)}; you cannot ${ACTION_WORDS[action]} now.`,
  }
}

export { holdsSpace }
