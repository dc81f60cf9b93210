import {
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  type PaginationState,
  type SortingState,
  type Updater,
} from '@tanstack/react-table'

/** The desk's tables sort and page on the server: the table holds the state, the query carries it. */
export const deskFeatures = tableFeatures({ rowSortingFeature, rowPaginationFeature })

export const applyUpdater = <T>(updater: Updater<T>, old: T): T =>
  typeof updater === 'function' ? (updater as (old: T) => T)(old) : updater

/** A column's sort as the query's order ("name", "-name"), or the list's own default when none is chosen. */
export function sortParam<S extends string>(sorting: SortingState, byColumn: Record<string, string>, fallback: S): S {
  const first = sorting[0]
  const key = first ? byColumn[first.id] : undefined
  if (!key) return fallback
  return (first.desc ? `-${key}` : key) as S
}

export const firstPage = (pagination: PaginationState): PaginationState => ({ ...pagination, pageIndex: 0 })
