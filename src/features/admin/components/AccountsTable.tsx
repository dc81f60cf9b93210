import { createColumnHelper, useTable, type PaginationState, type SortingState } from '@tanstack/react-table'
import { useMemo, useState } from 'react'
import type { DeskAccount } from '../../../../shared/api/admin'
import { formatDate } from '../../../../shared/dates'
import { DESK_ACCOUNT_STATES, type DeskAccountSort, type DeskAccountState } from '../../../../shared/schemas/admin'
import { USER_ROLES, type UserRole } from '../../../../shared/schemas/auth'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { Field, Select } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { useDeskAccounts, useSuspendAccount } from '../api/admin'
import { DeskPager } from './DeskPager'
import { DeskSearch } from './DeskSearch'
import { applyUpdater, deskFeatures, firstPage, sortParam } from './deskTable'

/** Kinds of account in the desk's words: the role value stays in the API. */
export const ACCOUNT_KIND_WORDS: Record<UserRole, string> = {
  potter: 'Potter',
  host: 'Studio owner',
  crew: 'Crew',
  admin: 'Desk',
}

const STATE_WORDS: Record<DeskAccountState, string> = { active: 'Active', suspended: 'Suspended' }
const DESK_ZONE = 'UTC'

const helper = createColumnHelper<typeof deskFeatures, DeskAccount>()

/** Accounts by name or address, of a kind and a state, paged on the server; suspending asks first. */
export function AccountsTable() {
  const [words, setWords] = useState('')
  const [role, setRole] = useState<UserRole | ''>('')
  const [state, setState] = useState<DeskAccountState | ''>('')
  const [sorting, setSorting] = useState<SortingState>([{ id: 'createdAt', desc: true }])
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 20 })
  const [asking, setAsking] = useState<DeskAccount | null>(null)
  const suspend = useSuspendAccount()
  const accounts = useDeskAccounts({
    q: words || undefined,
    role: role || undefined,
    state: state || undefined,
    sort: sortParam<DeskAccountSort>(sorting, { displayName: 'name', createdAt: 'created' }, '-created'),
    page: pagination.pageIndex + 1,
    perPage: pagination.pageSize,
  })

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('displayName', {
          header: 'Name',
          cell: ({ row }) => (
            <>
              <span className="font-medium">{row.original.displayName}</span>
              {row.original.self && <span className="ml-1 text-xs text-slip-600">(you)</span>}
              <span className="block break-all text-xs text-slip-600">{row.original.email}</span>
            </>
          ),
        }),
        helper.accessor('role', { header: 'Kind', enableSorting: false, cell: ({ row }) => ACCOUNT_KIND_WORDS[row.original.role] }),
        helper.accessor('createdAt', { header: 'Joined', cell: ({ row }) => formatDate(row.original.createdAt, DESK_ZONE) }),
        helper.accessor('suspended', {
          header: 'State',
          enableSorting: false,
          cell: ({ row }) => (row.original.suspended ? <Badge tone="danger">Suspended</Badge> : <Badge tone="celadon">Active</Badge>),
        }),
        helper.display({
          id: 'action',
          header: () => <span className="sr-only">Suspend or restore</span>,
          // The desk never offers to suspend the reader's own account (the server refuses it too).
          cell: ({ row }) =>
            row.original.self ? (
              <span className="text-xs text-slip-600" data-testid="own-account">
                Your own account
              </span>
            ) : row.original.suspended ? (
              <Button size="sm" variant="secondary" onClick={() => suspend.mutate({ id: row.original.id, suspended: false })}>
                Restore
              </Button>
            ) : (
              <Button size="sm" variant="ghost" onClick={() => setAsking(row.original)}>
                Suspend…
              </Button>
            ),
        }),
      ]),
    [suspend],
  )

  const table = useTable({
    features: deskFeatures,
    columns,
    data: accounts.data?.users ?? [],
    getRowId: (row) => row.id,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      setSorting((old) => applyUpdater(updater, old))
      setPagination(firstPage)
    },
    onPaginationChange: (updater) => setPagination((old) => applyUpdater(updater, old)),
    manualSorting: true,
    manualPagination: true,
    rowCount: accounts.data?.total ?? 0,
  })

  const narrowed = (change: () => void) => {
    change()
    setPagination(firstPage)
  }

  return (
    <div className="space-y-4">
      <DeskSearch
        label="Find accounts"
        fieldLabel="Name or e-mail"
        placeholder="e.g. okafor"
        words={words}
        onSearch={(next) => narrowed(() => setWords(next))}
      >
        <Field label="Kind" className="w-44">
          {(a11y) => (
            <Select {...a11y} value={role} onChange={(e) => narrowed(() => setRole(e.target.value as UserRole | ''))}>
              <option value="">Every kind</option>
              {USER_ROLES.map((value) => (
                <option key={value} value={value}>
                  {ACCOUNT_KIND_WORDS[value]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="State" className="w-40">
          {(a11y) => (
            <Select {...a11y} value={state} onChange={(e) => narrowed(() => setState(e.target.value as DeskAccountState | ''))}>
              <option value="">Any state</option>
              {DESK_ACCOUNT_STATES.map((value) => (
                <option key={value} value={value}>
                  {STATE_WORDS[value]}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </DeskSearch>
      {accounts.isError && <Alert tone="danger">{accounts.error.message}</Alert>}
      {suspend.isError && !asking && <Alert tone="danger">{suspend.error.message}</Alert>}
      {accounts.isPending ? (
        <Spinner label="Loading the accounts…" />
      ) : (
        <>
          <Table caption="Accounts">
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
              {table.getRowModel().rows.length === 0 ? (
                <tr>
                  <Td colSpan={columns.length} className="py-6 text-center text-slip-600">
                    No accounts match.
                  </Td>
                </tr>
              ) : (
                table.getRowModel().rows.map((row) => (
                  <tr key={row.id} data-testid="desk-account" data-account-id={row.id} data-suspended={row.original.suspended}>
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
            label="Pages of accounts"
            total={accounts.data?.total ?? 0}
            pageIndex={pagination.pageIndex}
            pageSize={pagination.pageSize}
            pageCount={table.getPageCount()}
            onPage={(index) => table.setPageIndex(index)}
            onPageSize={(size) => table.setPageSize(size)}
          />
        </>
      )}
      <ConfirmDialog
        open={asking !== null}
        onClose={() => {
          setAsking(null)
          suspend.reset()
        }}
        title={`Suspend ${asking?.displayName ?? ''}?`}
        confirmLabel="Suspend the account"
        tone="danger"
        busy={suspend.isPending}
        problem={suspend.isError ? suspend.error.message : null}
        onConfirm={() => asking && suspend.mutate({ id: asking.id, suspended: true }, { onSuccess: () => setAsking(null) })}
      >
        <p>They are signed out everywhere at once and cannot sign in until the account is restored.</p>
      </ConfirmDialog>
    </div>
  )
}
