// Firings in a potter's words on the search page, and times in the reader's own zone: a hit carries
// no studio zone, so each time is shown where the reader is, with the zone named.

import { zoneName } from '../../../shared/dates'

export const ATMOSPHERE_CHOICES = [
  { value: 'oxidation', label: 'Oxidation' },
  { value: 'reduction', label: 'Reduction' },
  { value: 'neutral', label: 'Neutral' },
] as const

export const FIRING_KIND_CHOICES = [
  { value: 'bisque', label: 'Bisque' },
  { value: 'glaze', label: 'Glaze' },
  { value: 'single', label: 'Single firing' },
  { value: 'lustre', label: 'Lustre, decals and china paint' },
  { value: 'raku', label: 'Raku' },
] as const

export const SORT_CHOICES = [
  { value: 'distance', label: 'Nearest first' },
  { value: 'soonest', label: 'Soonest drop-off' },
  { value: 'price', label: 'Lowest example price' },
  { value: 'rating', label: 'Most would fire here again' },
] as const

const KILN_KINDS: Record<string, string> = { electric: 'Electric', gas: 'Gas', wood: 'Wood', soda: 'Soda', salt: 'Salt', raku: 'Raku' }

const capitalised = (word: string) => word.charAt(0).toUpperCase() + word.slice(1)

export const atmosphereLabel = (value: string) => ATMOSPHERE_CHOICES.find((c) => c.value === value)?.label ?? capitalised(value)
export const firingKindLabel = (value: string) => FIRING_KIND_CHOICES.find((c) => c.value === value)?.label ?? capitalised(value)
export const kilnKindLabel = (value: string) => KILN_KINDS[value] ?? capitalised(value)

const dateTime = new Intl.DateTimeFormat(undefined, {
  weekday: 'short',
  month: 'short',
  day: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
  timeZoneName: 'short',
})
const dateOnly = new Intl.DateTimeFormat(undefined, { weekday: 'short', month: 'short', day: 'numeric' })

/** "Fri, May 8, 6:00 PM PDT" in the reader's locale and zone. */
export const formatWhen = (iso: string) => dateTime.format(new Date(iso))
/** "Sun, May 10": for the firing itself, where the day is what matters. */
export const formatDay = (iso: string) => dateOnly.format(new Date(iso))

/** The reader's zone as people say it, e.g. "Pacific Time", never its database id. */
export function readerZone(): string {
  return zoneName(Intl.DateTimeFormat().resolvedOptions().timeZone)
}
