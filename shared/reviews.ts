// What each side says after pickup. Not stars: a few questions that matter in contract firing, each
// answered yes, partly or no, and for the potter whether they would fire at the studio again. Neither
// side sees the other's answers until both have answered or the window closes, so no answer is a reply
// to the other; an answer is final once sent.

export const ANSWERS = ['yes', 'partly', 'no'] as const
export type Answer = (typeof ANSWERS)[number]

export const ANSWER_WORDS: Record<Answer, string> = { yes: 'Yes', partly: 'Partly', no: 'No' }

/** The potter's questions about the studio. */
export const STUDIO_QUESTIONS = [
  { key: 'loading', question: 'Was your ware handled and loaded with care?', short: 'Care in loading' },
  { key: 'resultsAsLogged', question: 'Did the ware come out as the firing log says it was fired?', short: 'Results as logged' },
  { key: 'turnaround', question: 'Was it ready by the date the studio gave?', short: 'Turnaround' },
  { key: 'communication', question: 'Did the studio keep you told along the way?', short: 'Kept you told' },
] as const

/** The studio's questions about the potter. */
export const POTTER_QUESTIONS = [
  { key: 'asDeclared', question: 'Was the ware as declared: count, sizes, clay and glaze?', short: 'Ware as declared' },
  { key: 'cleanAndDry', question: 'Were the feet clean of glaze and the greenware dry?', short: 'Clean feet, dry ware' },
  { key: 'onTime', question: 'Were drop-off and pickup on time?', short: 'On time' },
] as const

export type StudioQuestion = (typeof STUDIO_QUESTIONS)[number]['key']
export type PotterQuestion = (typeof POTTER_QUESTIONS)[number]['key']

export const FIRE_AGAIN_QUESTION = 'Would you fire here again?'

/**
 * How long after pickup the answers stay open: three weeks. Long enough to use the pots (delayed
 * crazing can show days or weeks after unloading, from memory), short enough that the answers still
 * speak of the firing they are about.
 */
export const REVIEW_WINDOW_DAYS = 21

/** When the answers close and are published, from the moment the ware was collected (or the dispute raised). */
export function reviewWindowClosesAt(openedAt: Date): Date {
  return new Date(openedAt.getTime() + REVIEW_WINDOW_DAYS * 86_400_000)
}

export type ReviewSide = 'potter' | 'studio'

/** The questions one side answers: the potter answers about the studio, the studio about the potter. */
export const questionsOf = (side: ReviewSide) => (side === 'potter' ? STUDIO_QUESTIONS : POTTER_QUESTIONS)

/** Field messages for the questions this side left unanswered (empty when all are answered). */
export function unanswered(side: ReviewSide, body: Partial<Record<string, unknown>>): Record<string, string> {
  const missing: Record<string, string> = {}
  for (const q of questionsOf(side)) if (body[q.key] === undefined) missing[q.key] = 'Choose yes, partly or no.'
  if (side === 'potter' && body.fireAgain === undefined) missing.fireAgain = 'Say whether you would fire here again.'
  return missing
}

// How a studio's answers become one number to rank by, without letting one or two happy potters
// outrank a long record: the share who would fire there again, smoothed toward a prior share (a
// Bayesian average, as with additive smoothing) that real answers outweigh as they add up.

/** The share of potters a studio is assumed to keep before its first published answer. */
export const PRIOR_FIRE_AGAIN = 0.7
/** How many answers' worth of weight the prior carries. */
export const PRIOR_WEIGHT = 5

export function fireAgainScore(yes: number, count: number, prior = PRIOR_FIRE_AGAIN, weight = PRIOR_WEIGHT): number {
  return (prior * weight + yes) / (weight + count)
}

/** A studio's published answers in brief: how many answered, how many would fire there again, the ranking score. */
export interface ReviewSummary {
  count: number
  fireAgain: number
  score: number
}

export function summariseFireAgain(fireAgain: readonly boolean[]): ReviewSummary | null {
  if (!fireAgain.length) return null
  const yes = fireAgain.filter(Boolean).length
  return { count: fireAgain.length, fireAgain: yes, score: fireAgainScore(yes, fireAgain.length) }
}

/** How often each answer was given to one question. */
export type AnswerTally = Record<Answer, number>

export function tally(answers: readonly (Answer | null)[]): AnswerTally {
  const counts: AnswerTally = { yes: 0, partly: 0, no: 0 }
  for (const a of answers) if (a) counts[a]++
  return counts
}
