// Dates as people read them, always in a named zone: a studio's deadlines are shown in the studio's
// time, whoever is looking.

export function formatDateTime(value: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', {
    timeZone,
    weekday: 'short',
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    timeZoneName: 'short',
  }).format(new Date(value))
}

/** The city a zone id is named after: "America/Los_Angeles" → "Los Angeles". */
export const zoneCity = (timeZone: string) => (timeZone.split('/').pop() ?? timeZone).replace(/_/g, ' ')

/**
 * A time zone as people say it ("Pacific Time", "Central European Time"), never its database id. Where
 * the runtime has no name for the zone but an offset ("GMT+5:45"), the id's city speaks for it.
 */
export function zoneName(timeZone: string): string {
  let name: string | undefined
  try {
    name = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'longGeneric' })
      .formatToParts(new Date())
      .find((part) => part.type === 'timeZoneName')?.value
  } catch {
    name = undefined
  }
  return name && !/^GMT([+-]|$)/.test(name) ? name : `${zoneCity(timeZone)} time`
}

export function formatDate(value: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, weekday: 'short', month: 'short', day: 'numeric', year: 'numeric' }).format(
    new Date(value),
  )
}

export function formatMoney(cents: number, currency: string): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}
