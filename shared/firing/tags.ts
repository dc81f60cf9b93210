// Tag codes for pieces: short, read aloud across a studio without confusion, typed on a phone when
// the camera cannot read the label. Eight characters in two groups of four ("K4XR-7M2H"): seven drawn
// at random and a check character that catches any single mistyped character and any two swapped.
//
// The alphabet has no two characters that look alike (no 1, I, L or J; no O, Q or D beside 0; no Z
// beside 2, S beside 5, B beside 8, G beside 6; no U or V) and at most one letter of each group that
// sounds alike when spoken (T of B C D E G P T V Z; K of A J K; X of F S X; M of M N; Y of I Y; W of
// Q U W): seventeen characters, a prime, so a weighted sum modulo 17 makes the check character.

export const TAG_ALPHABET = '023456789HKMRTWXY'
const SIZE = TAG_ALPHABET.length
const RANDOM_LENGTH = 7

/** Letters people type for ones the alphabet leaves out, read as the character they look like. */
const READ_AS: Record<string, string> = { O: '0', Q: '0', D: '0', Z: '2', S: '5', B: '8', G: '6' }

function checkCharacter(body: string): string {
  let sum = 0
  // Distinct non-zero weights modulo a prime: one wrong character or two swapped change the sum.
  for (let i = 0; i < body.length; i++) sum += (i + 1) * TAG_ALPHABET.indexOf(body[i])
  return TAG_ALPHABET[sum % SIZE]
}

/** A new tag from a source of random bytes (crypto.getRandomValues or randomBytes). */
export function newTag(randomBytes: (n: number) => Uint8Array): string {
  let body = ''
  while (body.length < RANDOM_LENGTH) {
    for (const byte of randomBytes(16)) {
      // Bytes above the largest multiple of the alphabet's size would favour its first characters.
      if (byte >= 256 - (256 % SIZE)) continue
      body += TAG_ALPHABET[byte % SIZE]
      if (body.length === RANDOM_LENGTH) break
    }
  }
  return formatTag(body + checkCharacter(body))
}

/** The tag as printed: two groups of four. */
export function formatTag(compact: string): string {
  return `${compact.slice(0, 4)}-${compact.slice(4)}`
}

export type TagReading = { ok: true; tag: string } | { ok: false; reason: string }

/**
 * Reads a tag as typed or scanned: any case, spaces and dashes anywhere, a look-alike letter read as
 * its digit, or the whole address the label's QR code holds. Says what is wrong when it cannot.
 */
export function readTag(input: string): TagReading {
  const text = input.trim()
  const fromLink = /\/pieces\/([^/?#\s]+)/.exec(text)
  const raw = (fromLink ? decodeURIComponent(fromLink[1]) : text).toUpperCase().replace(/[\s\-–—_.]/g, '')
  const compact = raw.replace(/[OQDZSBG]/g, (c) => READ_AS[c])
  if (compact.length !== RANDOM_LENGTH + 1) return { ok: false, reason: 'A tag has eight characters, like K4XR-7M2H.' }
  const stray = [...compact].find((c) => !TAG_ALPHABET.includes(c))
  if (stray) return { ok: false, reason: `Tags have no “${stray}”; check the label again.` }
  if (checkCharacter(compact.slice(0, RANDOM_LENGTH)) !== compact[RANDOM_LENGTH])
    return { ok: false, reason: 'That code is not a tag: one character is probably misread.' }
  return { ok: true, tag: formatTag(compact) }
}

/** The shape of a printed tag, for validating route parameters before the check character is read. */
export const TAG_PATTERN = new RegExp(`^[${TAG_ALPHABET}]{4}-[${TAG_ALPHABET}]{4}$`)
