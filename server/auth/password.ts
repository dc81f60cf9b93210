import bcrypt from 'bcryptjs'
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import * as common from '@zxcvbn-ts/language-common'
import * as en from '@zxcvbn-ts/language-en'

/** bcrypt work factor: 12 is the floor we accept (each step doubles the cost of guessing). */
export const BCRYPT_COST = 12

const zxcvbn = new ZxcvbnFactory({
  dictionary: { ...common.dictionary, ...en.dictionary },
  graphs: common.adjacencyGraphs,
  translations: en.translations,
})

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST)
}

// Compared against when the address is unknown, so a miss costs as long as a hit.
const DECOY_HASH = bcrypt.hashSync('decoy-password-never-matches', BCRYPT_COST)

export function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  return bcrypt.compare(password, hash ?? DECOY_HASH).then((ok) => ok && hash !== null)
}

/**
 * Why a new password is refused, or null. zxcvbn scores 0–4 from dictionaries of common and leaked
 * passwords, names and keyboard patterns; below 3 is guessable by an offline attack.
 */
export function passwordProblem(password: string, userInputs: string[] = []): string | null {
  // Whole inputs and their pieces: "hazel.quist@example.test" also counts "hazel" and "quist".
  const words = userInputs.flatMap((input) => [input, ...input.toLowerCase().split(/[^a-z0-9]+/)]).filter((w) => w.length >= 3)
  const result = zxcvbn.check(password, words)
  if (result.score >= 3) return null
  const why = result.feedback.warning || 'This password is too easy to guess.'
  const tip = result.feedback.suggestions[0] ?? 'Add more words or characters.'
  return `${why.replace(/\.?$/, '.')} ${tip}`
}
