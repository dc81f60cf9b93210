// Who may do what to a request, and when: one table (state × side → actions) plus the predicates that
// refine it (money owed, a price waiting, answers given after pickup). The server's one door refuses what this
// refuses, the request view lists what this allows, and the client's buttons show exactly that list.
import { takesRequests, type FiringStatus } from './firing-status'
import { REVIEW_WINDOW_DAYS } from '../reviews'
import { holdsSpace, REQUEST_STATE_LABELS, type RequestState } from './request-states'

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
  'dispute',
  'message',
  'hand-back',
] as const
export type RequestAction = (typeof REQUEST_ACTIONS)[number]

/**
 * Actions Conewright itself takes: a paid deposit arriving, a hold or a firing running out, a firing
 * moving, the answers after pickup published when their window closes; and the desk's own (behind the
 * admin guard): a refund, settling a dispute.
 */
export const SYSTEM_ACTIONS = [
  'deposit-paid',
  'balance-paid',
  'lapse',
  'firing-moved',
  'desk-refund',
  'desk-settle',
  'publish-reviews',
  // Incidents and damage claims: who may report, claim, pay, contest or decide is checked by the
  // incident's and the claim's own rules (server/services/incidents.ts, shared/claims.ts), in any state.
  'incident',
  'claim',
  // A card kept at the deposit: noted when Stripe has kept it, and forgotten by the potter alone.
  'kept-card',
  // Making good to a potter whose pieces an incident hurt (server/services/remedies.ts): the studio's owner only.
  'remedy',
] as const
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
  // A credit for ware hurt in an incident, given after pickup, may leave money owed back at the counter.
  collected: { potter: ['rate', 'dispute', 'message'], studio: ['rate', 'dispute', 'message', 'hand-back'], admin: [] },
  disputed: { potter: ['rate', 'message'], studio: ['rate', 'message', 'hand-back'], admin: [] },
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
  /** Which sides have given their answers after pickup (answers are final). */
  ratedBy: { potter: boolean; studio: boolean }
  /** Whether the window for answering after pickup is still open (see shared/reviews). */
  reviewWindowOpen: boolean
  /** Money taken at the counter that the studio owes back and has not yet marked handed back. */
  counterRefundDueCents: number
}

/** Whether the potter owes money now: the deposit before drop-off, the balance once ready. */
export function owesMoney(facts: RequestFacts): boolean {
  if (facts.state === 'accepted') return facts.depositOwedCents > 0
  if (facts.state === 'ready') return facts.balanceOwedCents > 0
  return false
}

/** Whether this side may still give its answers after pickup: once, and only while the window is open. */
export function canBeRated(facts: RequestFacts, side: Side): boolean {
  if (side === 'admin') return false
  return (facts.state === 'collected' || facts.state === 'disputed') && !facts.ratedBy[side] && facts.reviewWindowOpen
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

// The actions in the words of the refusals people read: ask, take on, turn down, call off.
const ACTION_WORDS: Record<RequestAction, string> = {
  edit: 'change the ware',
  send: 'send the ask',
  withdraw: 'withdraw the ask',
  'pay-deposit': 'pay the deposit',
  'answer-move': 'answer a suggested firing',
  accept: 'take this ware on',
  decline: 'turn the ask down',
  move: 'suggest another firing',
  cancel: 'call it off',
  'counter-payment': 'take a payment at the counter',
  'check-in': 'take the ware in',
  'tag-piece': 'tag a piece at drop-off',
  'hold-piece': 'hold a piece back or take it in again',
  'confirm-price': 'confirm the new price',
  'decline-price': 'turn down the new price',
  results: 'post results',
  ready: 'mark the ware ready for pickup',
  'pay-balance': 'pay the balance',
  collected: 'mark the ware picked up',
  rate: 'answer the questions after pickup',
  dispute: 'raise a dispute',
  message: 'write in the thread',
  'hand-back': 'mark money handed back at the counter',
}

/** Why a refining predicate said no, for the actions whose "not now" has a better word than the state. */
const NOT_NOW: Partial<Record<RequestAction, (facts: RequestFacts) => Omit<Refusal, 'status'>>> = {
  accept: () => ({ code: 'firing-not-open', message: 'This firing is not taking ware any more.' }),
  move: () => ({ code: 'firing-not-open', message: 'This firing is not taking ware any more.' }),
  'answer-move': () => ({ code: 'no-move', message: 'No other firing is waiting for your answer.' }),
  'pay-deposit': () => ({ code: 'nothing-owed', message: 'No deposit is owed here.' }),
  'pay-balance': () => ({ code: 'nothing-owed', message: 'Nothing is owed.' }),
  'counter-payment': () => ({ code: 'nothing-owed', message: 'Nothing is owed at this point.' }),
  'check-in': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; ware can no longer be taken in.' }),
  'tag-piece': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; pieces can no longer be tagged in.' }),
  'hold-piece': () => ({ code: 'firing-loaded', message: 'The firing is already loaded; a piece can no longer be held back.' }),
  'confirm-price': () => ({ code: 'nothing-to-confirm', message: 'No changed price waits for your answer.' }),
  'decline-price': () => ({ code: 'nothing-to-confirm', message: 'No changed price waits for your answer.' }),
  ready: () => ({ code: 'results-missing', message: 'Post the results first: the potter hears about them with the ready mail.' }),
  collected: (f) => ({
    code: 'balance-owed',
    message: `${(f.balanceOwedCents / 100).toFixed(2)} is still owed. Take it at the counter or let the potter pay online first.`,
  }),
  rate: (f) =>
    f.reviewWindowOpen
      ? { code: 'already-answered', message: 'You have given your answers; they cannot be changed.' }
      : { code: 'review-window-closed', message: `Answers close ${REVIEW_WINDOW_DAYS} days after pickup; this window has closed.` },
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
      message: 'The deposit is not paid yet. Record it at the counter first, or ask the potter to pay it online.',
    }
  }
  // Allowed in this state, but a predicate says not now.
  if (TABLE[facts.state][side].includes(action) && NOT_NOW[action]) return { status: 409, ...NOT_NOW[action]!(facts) }
  return {
    status: 409,
    code: 'bad-state-change',
    message: `You cannot ${ACTION_WORDS[action]} while this stands at “${REQUEST_STATE_LABELS[facts.state]}”.`,
  }
}

export { holdsSpace }
