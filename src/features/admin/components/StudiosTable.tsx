import { createColumnHelper, useTable, type PaginationState, type SortingState } from '@tanstack/react-table'
import { useMemo, useState } from 'react'
import { Link } from 'react-router-dom'
import type { DeskStudio } from '../../../../shared/api/admin'
import { formatDate } from '../../../../shared/dates'
import { DESK_STUDIO_STATES, type DeskStudioSort, type DeskStudioState } from '../../../../shared/schemas/admin'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Field, Select } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { useDeskStudios, useVerifyStudio } from '../api/admin'
import { DeskPager } from './DeskPager'
import { DeskSearch } from './DeskSearch'
import { applyUpdater, deskFeatures, firstPage, sortParam } from './deskTable'

const STATE_WORDS: Record<DeskStudioState, string> = {
  waiting: 'Waiting for verification',
  verified: 'Verified',
  unverified: 'Not verified',
  draft: 'Drafts (not published)',
}

/** The desk works in UTC: a studio's own zone is not the reader's, and the day is what matters here. */
const DESK_ZONE = 'UTC'

const helper = createColumnHelper<typeof deskFeatures, DeskStudio>()

function VerifyButton({ studio }: { studio: DeskStudio }) {
  const verify = useVerifyStudio()
  return (
    <div className="space-y-1">
      <Button
        size="sm"
        variant={studio.verified ? 'secondary' : 'primary'}
        busy={verify.isPending}
        onClick={() => verify.mutate({ id: studio.id, verified: !studio.verified })}
      >
        {studio.verified ? 'Withdraw verification' : 'Verify'}
      </Button>
      {verify.isError && <p className="text-xs text-danger-700">{verify.error.message}</p>}
    </div>
  )
}

/** Every studio, waiting ones first: found by name, town or owner, filtered by state, paged on the server. */
export function StudiosTable() {
  const [words, setWords] = useState('')
  const [state, setState] = useState<DeskStudioState | ''>('')
  const [sorting, setSorting] = useState<SortingState>([])
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 20 })
  const sort = sortParam<DeskStudioSort>(sorting, { name: 'name', createdAt: 'created' }, 'waiting')
  const studios = useDeskStudios({
    q: words || undefined,
    state: state || undefined,
    sort,
    page: pagination.pageIndex + 1,
    perPage: pagination.pageSize,
  })

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('name', {
          header: 'Studio',
          cell: ({ row }) => (
            <>
              <Link to={`/studios/${row.original.id}`} className="font-semibold text-clay-800 hover:underline">
                {row.original.name}
              </Link>
              <span className="block text-xs text-slip-600">{[row.original.city, row.original.region].filter(Boolean).join(', ')}</span>
            </>
          ),
        }),
        helper.display({
          id: 'owners',
          header: 'Owners',
          cell: ({ row }) =>
            row.original.owners.length === 0 ? (
              '—'
            ) : (
              <ul className="space-y-0.5">
                {row.original.owners.map((owner) => (
                  <li key={owner.email}>
                    {owner.name} <span className="block break-all text-xs text-slip-600">{owner.email}</span>
                  </li>
                ))}
              </ul>
            ),
        }),
        helper.display({
          id: 'kilns',
          header: 'Kilns and firings',
          cell: ({ row }) =>
            `${row.original.kilns} kiln${row.original.kilns === 1 ? '' : 's'}, ${row.original.upcomingFirings} firing${row.original.upcomingFirings === 1 ? '' : 's'} ahead`,
        }),
        helper.accessor('createdAt', { header: 'Joined', cell: ({ row }) => formatDate(row.original.createdAt, DESK_ZONE) }),
        helper.display({
          id: 'state',
          header: 'State',
          cell: ({ row }) => (
            <span className="flex flex-wrap gap-1">
              {!row.original.published && <Badge>Draft</Badge>}
              {row.original.verified ? <Badge tone="celadon">Verified</Badge> : <Badge tone="ember">Not verified</Badge>}
            </span>
          ),
        }),
        helper.display({
          id: 'verify',
          header: () => <span className="sr-only">Verify</span>,
          cell: ({ row }) => <VerifyButton studio={row.original} />,
        }),
      ]),
    [],
  )

  const table = useTable({
    features: deskFeatures,
    columns,
    data: studios.data?.studios ?? [],
    getRowId: (row) => row.id,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      setSorting((old) => applyUpdater(updater, old))
      setPagination(firstPage)
    },
    onPaginationChange: (updater) => setPagination((old) => applyUpdater(updater, old)),
    manualSorting: true,
    manualPagination: true,
    rowCount: studios.data?.total ?? 0,
    enableSortingRemoval: true,
  })

  return (
    <div className="space-y-4">
      <DeskSearch
        label="Find studios"
        fieldLabel="Name, town or owner"
        placeholder="e.g. Alder or okafor"
        words={words}
        onSearch={(next) => {
          setWords(next)
          setPagination(firstPage)
        }}
      >
        <Field label="Show" className="w-60">
          {(a11y) => (
            <Select
              {...a11y}
              value={state}
              onChange={(e) => {
                setState(e.target.value as DeskStudioState | '')
                setPagination(firstPage)
              }}
            >
              <option value="">Every studio, waiting ones first</option>
              {DESK_STUDIO_STATES.map((value) => (
                <option key={value} value={value}>
                  {STATE_WORDS[value]}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </DeskSearch>
      {studios.isError && <Alert tone="danger">{studios.error.message}</Alert>}
      {studios.isPending ? (
        <Spinner label="Loading the studios…" />
      ) : (
        <>
          <Table caption="Studios">
            <thead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => (
                    <Th
                      key={header.id}
                      sort={
                        header.column.getCanSort() && (header.column.id === 'name' || header.column.id === 'createdAt')
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
              {table.getRowModel().rows.length === 0 ? (
                <tr>
                  <Td colSpan={columns.length} className="py-6 text-center text-slip-600">
                    No studios match.
                  </Td>
                </tr>
              ) : (
                table.getRowModel().rows.map((row) => (
                  <tr key={row.id} data-testid="desk-studio" data-studio-id={row.id}>
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
          <DeskPager
            label="Pages of studios"
            total={studios.data?.total ?? 0}
            pageIndex={pagination.pageIndex}
            pageSize={pagination.pageSize}
            pageCount={table.getPageCount()}
            onPage={(index) => table.setPageIndex(index)}
            onPageSize={(size) => table.setPageSize(size)}
          />
        </>
      )}
    </div>
  )
}
