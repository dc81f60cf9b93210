// The answers after pickup: which questions each side answers, the window, and the ranking score. The
// score is a Bayesian average of the share who would fire there again, (C·m + Σx) / (C + n) with prior
// mean m weighted as C answers — the usual form of a Bayesian (smoothed) average, from memory.
import { describe, expect, it } from 'vitest'
import {
  fireAgainScore,
  PRIOR_FIRE_AGAIN,
  PRIOR_WEIGHT,
  questionsOf,
  REVIEW_WINDOW_DAYS,
  reviewWindowClosesAt,
  summariseFireAgain,
  tally,
  unanswered,
} from '../../shared/reviews'
import { reviewSchema } from '../../shared/schemas/pickup'

describe('the questions after pickup', () => {
  it('asks the potter about the studio and the studio about the potter, with no stars anywhere', () => {
    expect(questionsOf('potter').map((q) => q.key)).toEqual(['loading', 'resultsAsLogged', 'turnaround', 'communication'])
    expect(questionsOf('studio').map((q) => q.key)).toEqual(['asDeclared', 'cleanAndDry', 'onTime'])
    expect(reviewSchema.safeParse({ loading: 4 }).success).toBe(false)
    expect(reviewSchema.safeParse({ stars: 5 }).data).not.toHaveProperty('stars')
  })

  it('names each question a side left open, and whether the potter would fire there again', () => {
    expect(Object.keys(unanswered('potter', { loading: 'yes' }))).toEqual(['resultsAsLogged', 'turnaround', 'communication', 'fireAgain'])
    expect(
      unanswered('potter', { loading: 'yes', resultsAsLogged: 'no', turnaround: 'partly', communication: 'yes', fireAgain: false }),
    ).toEqual({})
    // The potter's questions do not answer the studio's.
    expect(Object.keys(unanswered('studio', { loading: 'yes', fireAgain: true }))).toEqual(['asDeclared', 'cleanAndDry', 'onTime'])
  })

  it('closes the window three weeks after pickup', () => {
    expect(REVIEW_WINDOW_DAYS).toBe(21)
    expect(reviewWindowClosesAt(new Date('2026-03-01T18:00:00Z')).toISOString()).toBe('2026-03-22T18:00:00.000Z')
  })
})

describe('the ranking score', () => {
  it('is the Bayesian average of the share who would fire again', () => {
    // Hand-worked with prior 0.7 weighted as 5 answers: (0.7·5 + 2) / (5 + 2) = 5.5 / 7.
    expect(PRIOR_FIRE_AGAIN).toBe(0.7)
    expect(PRIOR_WEIGHT).toBe(5)
    expect(fireAgainScore(2, 2)).toBeCloseTo(5.5 / 7, 12)
    expect(fireAgainScore(0, 0)).toBe(PRIOR_FIRE_AGAIN)
  })

  it('lets a long good record outrank two happy potters, and stays between the prior and the plain share', () => {
    expect(fireAgainScore(18, 20)).toBeGreaterThan(fireAgainScore(2, 2))
    const summary = summariseFireAgain([true, true, false])!
    expect(summary).toMatchObject({ count: 3, fireAgain: 2 })
    expect(summary.score).toBeGreaterThanOrEqual(2 / 3)
    expect(summary.score).toBeLessThanOrEqual(PRIOR_FIRE_AGAIN)
    expect(summariseFireAgain([])).toBeNull()
  })

  it('tallies how often each answer was given', () => {
    expect(tally(['yes', 'yes', 'partly', null, 'no'])).toEqual({ yes: 2, partly: 1, no: 1 })
  })
})
