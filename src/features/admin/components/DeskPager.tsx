import { Button } from '../../../components/ui/Button'
import { Select } from '../../../components/ui/Field'

const PER_PAGE_CHOICES = [10, 20, 50, 100] as const

interface DeskPagerProps {
  /** Names the pages for a screen reader: "Pages of studios". */
  label: string
  total: number
  pageIndex: number
  pageSize: number
  pageCount: number
  onPage: (pageIndex: number) => void
  onPageSize: (pageSize: number) => void
}

/** Where in a long list the desk is, with the previous and next page and how many rows a page shows. */
export function DeskPager({ label, total, pageIndex, pageSize, pageCount, onPage, onPageSize }: DeskPagerProps) {
  const first = total === 0 ? 0 : pageIndex * pageSize + 1
  const last = Math.min(total, (pageIndex + 1) * pageSize)
  return (
    <nav aria-label={label} className="flex flex-wrap items-center justify-between gap-3 text-sm text-slip-700">
      <p data-testid="desk-range">
        {first}–{last} of {total}
      </p>
      <div className="flex items-center gap-2">
        <Button variant="secondary" size="sm" disabled={pageIndex === 0} onClick={() => onPage(pageIndex - 1)}>
          Previous
        </Button>
        <span>
          Page {pageIndex + 1} of {Math.max(1, pageCount)}
        </span>
        <Button variant="secondary" size="sm" disabled={pageIndex + 1 >= pageCount} onClick={() => onPage(pageIndex + 1)}>
          Next
        </Button>
      </div>
      <label className="flex items-center gap-2">
        <span className="whitespace-nowrap">Per page</span>
        <Select className="w-auto" value={String(pageSize)} onChange={(e) => onPageSize(Number(e.target.value))}>
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
