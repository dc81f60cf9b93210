import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  rowSortingFeature,
  sortFn_basic,
  tableFeatures,
  useTable,
} from '@tanstack/react-table'
import { useMemo } from 'react'
import { formatDateTime } from '../../../../shared/dates'
import { FIRING_STATUSES, FIRING_STATUS_LABELS } from '../../../../shared/workflow/firing-status'
import { Button } from '../../../components/ui/Button'
import { Field, Select } from '../../../components/ui/Field'
import { Table, Td, Th } from '../../../components/ui/Table'
import type { FiringRecord, KilnRecord } from '../api/types'
import { firingInWords } from '../../../lib/firingWords'
import { FillGauge } from './FillGauge'
import { FiringStatusBadge } from './FiringStatusBadge'

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { basic: sortFn_basic },
  filterFns: { equalsString: filterFn_equalsString },
})
const helper = createColumnHelper<typeof features, FiringRecord>()

interface FiringTableProps {
  firings: FiringRecord[]
  kilns: KilnRecord[]
  zone: string
  onOpen: (firing: FiringRecord) => void
}

/** Firings as a table: sorted by date (either way) or space left, filtered by kiln and status. */
export function FiringTable({ firings, kilns, zone, onOpen }: FiringTableProps) {
  const columns = useMemo(() => {
    const kilnName = (id: string) => kilns.find((k) => k.id === id)?.name ?? 'Kiln'
    return helper.columns([
      helper.accessor((f) => Date.parse(f.firingDate), {
        id: 'firingDate',
        header: 'Fires',
        sortFn: 'basic',
        cell: ({ row }) => (
          <>
            <span className="font-medium">{formatDateTime(row.original.firingDate, zone)}</span>
            <span className="block text-xs text-slip-500">Drop-off by {formatDateTime(row.original.dropOffBy, zone)}</span>
          </>
        ),
      }),
      helper.accessor('kilnId', {
        header: 'Kiln',
        enableSorting: false,
        filterFn: 'equalsString',
        cell: ({ row }) => kilnName(row.original.kilnId),
      }),
      helper.display({ id: 'firing', header: 'Firing', cell: ({ row }) => firingInWords(row.original) }),
      helper.accessor((firing) => firing.space.shelvesLeft, {
        id: 'space',
        header: 'Space',
        sortFn: 'basic',
        cell: ({ row }) => <FillGauge firing={row.original} />,
      }),
      helper.accessor('status', {
        header: 'Status',
        enableSorting: false,
        filterFn: 'equalsString',
        cell: ({ row }) => <FiringStatusBadge status={row.original.status} />,
      }),
      helper.display({
        id: 'open',
        header: () => <span className="sr-only">Open</span>,
        cell: ({ row }) => (
          <Button variant="secondary" size="sm" onClick={() => onOpen(row.original)}>
            Manage
          </Button>
        ),
      }),
    ])
  }, [kilns, zone, onOpen])

  const table = useTable({
    features,
    columns,
    data: firings,
    getRowId: (row) => row.id,
    initialState: { sorting: [{ id: 'firingDate', desc: false }] },
    enableSortingRemoval: false,
  })
  const kilnFilter = (table.getColumn('kilnId')?.getFilterValue() as string | undefined) ?? ''
  const statusFilter = (table.getColumn('status')?.getFilterValue() as string | undefined) ?? ''
  const rows = table.getRowModel().rows

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-3">
        <Field label="Kiln" className="w-48">
          {(a11y) => (
            <Select {...a11y} value={kilnFilter} onChange={(e) => table.getColumn('kilnId')?.setFilterValue(e.target.value || undefined)}>
              <option value="">All kilns</option>
              {kilns.map((kiln) => (
                <option key={kiln.id} value={kiln.id}>
                  {kiln.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Status" className="w-48">
          {(a11y) => (
            <Select {...a11y} value={statusFilter} onChange={(e) => table.getColumn('status')?.setFilterValue(e.target.value || undefined)}>
              <option value="">Any status</option>
              {FIRING_STATUSES.map((status) => (
                <option key={status} value={status}>
                  {FIRING_STATUS_LABELS[status]}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </div>
      <Table caption="Firings">
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <Th
                  key={header.id}
                  sort={
                    header.column.getCanSort()
                      ? { direction: header.column.getIsSorted(), onToggle: () => header.column.toggleSorting() }
                      : undefined
                  }
                >
                  {header.isPlaceholder ? null : <table.FlexRender header={header} />}
                </Th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-slip-100">
          {rows.length === 0 ? (
            <tr>
              <Td colSpan={columns.length} className="py-6 text-center text-slip-600">
                No firings match.
              </Td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} data-testid="calendar-firing-row">
                {row.getAllCells().map((cell) => (
                  <Td key={cell.id}>
                    <table.FlexRender cell={cell} />
                  </Td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </Table>
    </div>
  )
}
