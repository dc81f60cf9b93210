// The search lives in the URL: one spelling per search, so a link is the search and the cache key is
// stable. These are the rules of our own URL, checked against the platform's URLSearchParams.
import { describe, expect, it } from 'vitest'
import {
  apiQueryString,
  normaliseSearch,
  readSearchState,
  searchProblems,
  searchString,
  withFilters,
  withPage,
} from '../../../src/features/search/searchState'

describe('the search in the URL', () => {
  it('spells one search one way: trimmed, defaults dropped, parameters in a fixed order', () => {
    const a = searchString({ cone: '6', place: ' Portland, OR ', page: '1', perPage: '20' })
    const b = searchString({ place: 'Portland, OR', cone: '6' })
    expect(a).toBe(b)
    expect(a).toBe(
      new URLSearchParams([
        ['place', 'Portland, OR'],
        ['cone', '6'],
      ]).toString(),
    )
  })

  it('drops a distance and “nearest first” once there is no place to measure from', () => {
    expect(normaliseSearch({ radiusKm: '50', sort: 'distance', cone: '10' })).toEqual({ cone: '10' })
    expect(normaliseSearch({ place: '97214', radiusKm: '50', sort: 'distance' })).toEqual({
      place: '97214',
      radiusKm: '50',
      sort: 'distance',
    })
  })

  it('starts again at the first page when a filter changes', () => {
    const paged = withPage({ place: '97214' }, 3)
    expect(paged.page).toBe('3')
    expect(withFilters(paged, { atmosphere: 'reduction' })).toEqual({ place: '97214', atmosphere: 'reduction' })
  })

  it('reads back what it wrote', () => {
    const state = { place: 'Boise, ID', cone: '04-6', from: '2027-03-01', sort: 'soonest' }
    expect(readSearchState(new URLSearchParams(searchString(state)))).toEqual(normaliseSearch(state))
  })

  it('asks the API for whole local days of drop-off', () => {
    const query = new URLSearchParams(apiQueryString({ from: '2027-03-01', to: '2027-03-02' }))
    expect(query.get('from')).toBe(new Date('2027-03-01T00:00:00').toISOString())
    expect(query.get('to')).toBe(new Date('2027-03-02T23:59:59').toISOString())
  })

  it('names what is wrong by field with the shared schema, before anything is sent', () => {
    expect(searchProblems({ place: '97214' })).toBeNull()
    expect(searchProblems({ radiusKm: 'far', place: '97214' })).toHaveProperty('radiusKm')
  })
})
