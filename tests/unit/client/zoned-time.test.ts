// The studio's calendar is in the studio's zone whoever looks. Checked against the IANA tz database as
// the platform's Intl API carries it, and the US daylight-saving rules (Energy Policy Act of 2005:
// second Sunday of March to first Sunday of November).
import { describe, expect, it } from 'vitest'
import { dayKey, isoToZonedInput, monthGrid, shiftMonth, zonedInputToIso } from '../../../src/features/studios/zonedTime'

describe('zoned times on the studio pages', () => {
  it('reads a typed 6 pm as 6 pm in the studio’s zone, on both sides of a clock change', () => {
    // 2027-03-14 is the second Sunday of March: Pacific time goes from UTC−8 to UTC−7.
    expect(zonedInputToIso('2027-03-13T18:00', 'America/Los_Angeles')).toBe('2027-03-14T02:00:00.000Z')
    expect(zonedInputToIso('2027-03-15T18:00', 'America/Los_Angeles')).toBe('2027-03-16T01:00:00.000Z')
    expect(zonedInputToIso('2027-03-15T18:00', 'America/Toronto')).toBe('2027-03-15T22:00:00.000Z')
  })

  it('writes an instant back as the zone’s wall clock', () => {
    expect(isoToZonedInput('2027-03-16T01:00:00.000Z', 'America/Los_Angeles')).toBe('2027-03-15T18:00')
    expect(isoToZonedInput('2027-03-16T01:00:00.000Z', 'America/New_York')).toBe('2027-03-15T21:00')
  })

  it('refuses an incomplete input instead of guessing', () => {
    expect(zonedInputToIso('2027-03-15', 'America/Los_Angeles')).toBeNull()
    expect(zonedInputToIso('', 'America/Los_Angeles')).toBeNull()
  })

  it('groups by the studio’s calendar day, not the viewer’s', () => {
    // 03:30 UTC on the 16th is still the evening of the 15th on the Pacific coast.
    expect(dayKey('2027-03-16T03:30:00Z', 'America/Los_Angeles')).toBe('2027-03-15')
    expect(dayKey('2027-03-16T03:30:00Z', 'Europe/London')).toBe('2027-03-16')
  })

  it('lays a month out in whole weeks from Sunday, and steps across years', () => {
    const grid = monthGrid('2027-02', 'America/Los_Angeles')
    // February 2027 starts on a Monday and ends on a Sunday (Gregorian calendar): five grid weeks.
    expect(grid.weeks).toHaveLength(5)
    expect(grid.weeks[0][0]).toMatchObject({ key: '2027-01-31', inMonth: false })
    expect(grid.weeks[0][1]).toMatchObject({ key: '2027-02-01', inMonth: true })
    expect(grid.weeks.every((w) => w.length === 7)).toBe(true)
    expect(shiftMonth('2026-12', 1)).toBe('2027-01')
    expect(shiftMonth('2027-01', -1)).toBe('2026-12')
  })
})
