// Each potter's pieces in one colour in the load view: light fills from the theme's tokens, so the
// dark tag text stays readable on every one. More potters than colours share them, with the name beside.
const FILLS = [
  'var(--color-clay-200)',
  'var(--color-celadon-300)',
  'var(--color-ember-300)',
  'var(--color-water-300)',
  'var(--color-slip-300)',
  'var(--color-clay-100)',
  'var(--color-celadon-100)',
  'var(--color-ember-100)',
  'var(--color-water-100)',
] as const

export function potterColours(potters: { id: string }[]): Map<string, string> {
  return new Map(potters.map((p, i) => [p.id, FILLS[i % FILLS.length]]))
}
