import { useCallback, useMemo, useState } from 'react'
import { useParams, useSearchParams } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Checkbox } from '../../../components/ui/Field'
import { EmptyState, PageHeader } from '../../../components/ui/Card'
import { Dialog } from '../../../components/ui/Dialog'
import { Spinner } from '../../../components/ui/Spinner'
import { TabPanel, Tabs } from '../../../components/ui/Tabs'
import { useStudioFirings } from '../api/firings'
import { useStudioKilns } from '../api/kilns'
import { useStudio } from '../api/studios'
import { isMemberView, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { FiringDialog } from '../components/FiringDialog'
import { FiringForm } from '../components/FiringForm'
import { FiringMonth } from '../components/FiringMonth'
import { FiringTable } from '../components/FiringTable'
import { StudioNav } from '../components/StudioNav'
import { useSelectedFiring } from '../hooks/useSelectedFiring'
import { dayKey, monthGrid, monthOf, shiftMonth } from '../zonedTime'

type View = 'month' | 'list'

/** /studios/:id/calendar: the studio's firings by month or as a table; post, move on and cancel them. */
export function CalendarPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the calendar…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" onRetry={() => studio.refetch()} />
  if (!isMemberView(studio.data)) {
    return (
      <Alert tone="warning" title="The calendar is for the studio’s own people">
        Potters see the coming firings on the studio’s public page.
      </Alert>
    )
  }
  return <Calendar key={studio.data.id} studio={studio.data} />
}

function Calendar({ studio }: { studio: MemberStudio }) {
  const zone = studio.timezone
  const [params, setParams] = useSearchParams()
  const view: View = params.get('view') === 'list' ? 'list' : 'month'
  const month = /^\d{4}-\d{2}$/.test(params.get('month') ?? '') ? params.get('month')! : monthOf(new Date(), zone)
  const [showPast, setShowPast] = useState(false)
  const [posting, setPosting] = useState(false)
  const [posted, setPosted] = useState<number | null>(null)
  const [now] = useState(() => new Date())

  const setParam = (key: string, value: string) =>
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev)
        next.set(key, value)
        return next
      },
      { replace: true, flushSync: true },
    )

  const grid = useMemo(() => monthGrid(month, zone), [month, zone])
  const range = useMemo(
    () =>
      view === 'month'
        ? { from: grid.from, to: grid.to, includeCancelled: true }
        : { from: showPast ? undefined : now.toISOString(), includeCancelled: true },
    [view, grid, showPast, now],
  )
  const kilns = useStudioKilns(studio.id)
  const firings = useStudioFirings(studio.id, range)
  const dialog = useSelectedFiring(firings.data)
  const liveKilns = useMemo(() => kilns.data?.filter((k) => !k.retired) ?? [], [kilns.data])
  const kilnName = useCallback((kilnId: string) => kilns.data?.find((k) => k.id === kilnId)?.name ?? 'Kiln', [kilns.data])
  const onOpen = dialog.open

  return (
    <>
      <PageHeader
        title="Firing calendar"
        lead={`${studio.name} · times in ${zone}`}
        actions={
          <Button onClick={() => setPosting(true)} disabled={liveKilns.length === 0}>
            Post a firing
          </Button>
        }
      />
      <StudioNav studioId={studio.id} role={studio.myRole} />
      {posted !== null && (
        <Alert tone="success" className="mb-4">
          {posted === 1 ? 'Firing posted.' : `${posted} firings posted.`}
        </Alert>
      )}
      {kilns.isSuccess && liveKilns.length === 0 && (
        <EmptyState
          title="No kilns to fire yet"
          action={studio.myRole === 'owner' ? <ButtonLink to={`/studios/${studio.id}/kilns/new`}>Add a kiln</ButtonLink> : undefined}
        >
          Firings are posted per kiln. {studio.myRole === 'owner' ? 'Add one first.' : 'The owner adds the kilns.'}
        </EmptyState>
      )}
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <Tabs
          label="Calendar view"
          idBase="calendar"
          value={view}
          onChange={(v) => setParam('view', v)}
          tabs={[
            { value: 'month', label: 'Month' },
            { value: 'list', label: 'List' },
          ]}
        />
        {view === 'month' ? (
          <div className="flex items-center gap-2">
            <Button variant="secondary" size="sm" onClick={() => setParam('month', shiftMonth(month, -1))} aria-label="Previous month">
              ←
            </Button>
            <h2 className="min-w-36 text-center font-semibold" aria-live="polite">
              {grid.title}
            </h2>
            <Button variant="secondary" size="sm" onClick={() => setParam('month', shiftMonth(month, 1))} aria-label="Next month">
              →
            </Button>
            <Button variant="ghost" size="sm" onClick={() => setParam('month', monthOf(new Date(), zone))}>
              Today
            </Button>
          </div>
        ) : (
          <Checkbox label="Show past firings" checked={showPast} onChange={(e) => setShowPast(e.target.checked)} />
        )}
      </div>
      <TabPanel idBase="calendar" value={view}>
        {firings.isPending || kilns.isPending ? (
          <Spinner label="Loading firings…" />
        ) : firings.isError ? (
          <ApiProblem error={firings.error} what="the firings" onRetry={() => firings.refetch()} />
        ) : kilns.isError ? (
          <ApiProblem error={kilns.error} what="the kilns" />
        ) : view === 'month' ? (
          <FiringMonth grid={grid} firings={firings.data} zone={zone} kilnName={kilnName} onOpen={onOpen} today={dayKey(now, zone)} />
        ) : (
          <FiringTable firings={firings.data} kilns={kilns.data} zone={zone} onOpen={onOpen} />
        )}
      </TabPanel>

      <Dialog open={posting} onClose={() => setPosting(false)} title="Post a firing" description={`Times in ${zone}.`} size="lg">
        <FiringForm
          studioId={studio.id}
          zone={zone}
          kilns={liveKilns}
          onCancel={() => setPosting(false)}
          onCreated={(created) => {
            setPosting(false)
            setPosted(created.length)
            if (view === 'month' && created[0]) setParam('month', monthOf(new Date(created[0].firingDate), zone))
          }}
        />
      </Dialog>
      <FiringDialog
        firing={dialog.selected}
        kilnName={dialog.selected ? kilnName(dialog.selected.kilnId) : ''}
        zone={zone}
        onClose={dialog.close}
      />
    </>
  )
}
