// How a studio's ratings become one number to rank by, without letting a handful of five-star
// ratings outrank a long record: a Bayesian average that starts every studio at a prior and lets
// real ratings outweigh it as they add up.

/** The mean a studio is assumed to have before its first rating. */
export const PRIOR_MEAN = 3.5
/** How many ratings' worth of weight the prior carries. */
export const PRIOR_WEIGHT = 5

export function bayesianScore(sum: number, count: number, priorMean = PRIOR_MEAN, priorWeight = PRIOR_WEIGHT): number {
  return (priorMean * priorWeight + sum) / (priorWeight + count)
}

export interface RatingSummary {
  mean: number
  count: number
  score: number
}

export function summarise(stars: readonly number[]): RatingSummary | null {
  if (!stars.length) return null
  const sum = stars.reduce((a, b) => a + b, 0)
  return { mean: sum / stars.length, count: stars.length, score: bayesianScore(sum, stars.length) }
}
