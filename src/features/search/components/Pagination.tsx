import { Link } from 'react-router-dom'
import { Select } from '../../../components/ui/Field'
import { searchString, withFilters, withPage, type SearchState } from '../searchState'

const PER_PAGE_CHOICES = [10, 20, 50] as const
/** The schema's last page. */
const MAX_PAGE = 250

interface PaginationProps {
  state: SearchState
  total: number
  page: number
  perPage: number
  onSearch: (next: SearchState) => void
}

const pageLink = 'rounded-control border border-slip-300 bg-white px-3 py-1.5 text-sm font-medium text-slip-800 hover:bg-slip-100'

export function Pagination({ state, total, page, perPage, onSearch }: PaginationProps) {
  const pages = Math.min(MAX_PAGE, Math.max(1, Math.ceil(total / perPage)))
  const first = total === 0 ? 0 : (page - 1) * perPage + 1
  const last = Math.min(total, page * perPage)
  return (
    <nav aria-label="Pages of results" className="flex flex-wrap items-center justify-between gap-3 text-sm text-slip-700">
      <p data-testid="result-range">
        {first}–{last} of {total}
      </p>
      <div className="flex items-center gap-2">
        {page > 1 ? (
          <Link to={`?${searchString(withPage(state, page - 1))}`} className={pageLink} rel="prev">
            Previous
          </Link>
        ) : (
          <span className={`${pageLink} cursor-default opacity-50`} aria-disabled="true">
            Previous
          </span>
        )}
        <span>
          Page {page} of {pages}
        </span>
        {page < pages ? (
          <Link to={`?${searchString(withPage(state, page + 1))}`} className={pageLink} rel="next">
            Next
          </Link>
        ) : (
          <span className={`${pageLink} cursor-default opacity-50`} aria-disabled="true">
            Next
          </span>
        )}
      </div>
      <label className="flex items-center gap-2">
        <span className="whitespace-nowrap">Per page</span>
        <Select className="w-auto" value={String(perPage)} onChange={(e) => onSearch(withFilters(state, { perPage: e.target.value }))}>
          {PER_PAGE_CHOICES.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </Select>
      </label>
    </nav>
  )
}
