import { useId, type ReactNode, type TdHTMLAttributes, type ThHTMLAttributes } from 'react'

/**
 * A bordered table that scrolls sideways on a narrow screen instead of squeezing its columns. The
 * scrolling box takes keyboard focus (named by the caption), so it can be scrolled without a mouse.
 * It is positioned so that screen-reader-only words in a far column (absolutely placed) scroll inside
 * it too, rather than pushing the whole page sideways.
 */
export function Table({ caption, children, className = '' }: { caption?: ReactNode; children: ReactNode; className?: string }) {
  const captionId = useId()
  return (
    <div
      role="region"
      tabIndex={0}
      aria-labelledby={caption ? captionId : undefined}
      className={`focus-ring relative overflow-x-auto rounded-card border border-slip-200 bg-white ${className}`}
    >
      <table className="min-w-full divide-y divide-slip-200 text-left text-sm">
        {caption && (
          <caption id={captionId} className="sr-only">
            {caption}
          </caption>
        )}
        {children}
      </table>
    </div>
  )
}

export type SortDirection = 'asc' | 'desc' | false

const ariaSort = (direction: SortDirection) => (direction === 'asc' ? 'ascending' : direction === 'desc' ? 'descending' : 'none')

interface ThProps extends ThHTMLAttributes<HTMLTableCellElement> {
  /** Set on sortable columns: the header becomes a button that reports its order. */
  sort?: { direction: SortDirection; onToggle: () => void }
}

export function Th({ sort, children, className = '', ...rest }: ThProps) {
  return (
    <th
      scope="col"
      aria-sort={sort ? ariaSort(sort.direction) : undefined}
      className={`whitespace-nowrap bg-slip-50 px-3 py-2 text-xs font-semibold uppercase tracking-wide text-slip-600 ${className}`}
      {...rest}
    >
      {sort ? (
        <button
          type="button"
          onClick={sort.onToggle}
          className="focus-ring inline-flex items-center gap-1 rounded uppercase hover:text-slip-900"
        >
          {children}
          <span aria-hidden className="text-slip-500">
            {sort.direction === 'asc' ? '▲' : sort.direction === 'desc' ? '▼' : '↕'}
          </span>
        </button>
      ) : (
        children
      )}
    </th>
  )
}

export function Td({ children, className = '', ...rest }: TdHTMLAttributes<HTMLTableCellElement>) {
  return (
    <td className={`px-3 py-2 align-top text-slip-800 ${className}`} {...rest}>
      {children}
    </td>
  )
}
