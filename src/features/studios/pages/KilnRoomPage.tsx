import { zoneName } from '../../../../shared/dates'
import { useState } from 'react'
import { Link } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Dialog } from '../../../components/ui/Dialog'
import { Spinner } from '../../../components/ui/Spinner'
import { useMe } from '../../auth/api/auth'
import { useStudioFirings } from '../api/firings'
import { useStudioKilns } from '../api/kilns'
import { useMyStudios, useUpdateStudio } from '../api/studios'
import { useWaitingRequests } from '../api/waitingRequests'
import type { FiringRecord, MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { FiringDialog } from '../components/FiringDialog'
import { FiringForm } from '../components/FiringForm'
import { FiringRows } from '../components/FiringRows'
import { StudioCreateForm } from '../components/StudioCreateForm'
import { useSelectedFiring } from '../hooks/useSelectedFiring'

/** How many upcoming firings each studio shows here; the calendar has the rest. */
const UPCOMING_SHOWN = 8

/** The studio owner's and crew's home: each studio's coming firings, how full they are, and what to do next. */
export function KilnRoomPage() {
  const me = useMe()
  const studios = useMyStudios()
  const [adding, setAdding] = useState(false)
  const [justCreated, setJustCreated] = useState<string | null>(null)
  const user = me.data
  // The stored role value for a studio owner is 'host'.
  const isStudioOwner = user?.role === 'host' || user?.role === 'admin'

  return (
    <>
      <PageHeader
        title="Kiln room"
        lead={`Welcome, ${user?.displayName ?? ''}. Your studios’ coming firings and how full they are.`}
        actions={
          isStudioOwner && studios.data && studios.data.length > 0 && !adding ? (
            <Button variant="secondary" onClick={() => setAdding(true)}>
              Add another studio
            </Button>
          ) : undefined
        }
      />
      {studios.isPending ? (
        <Spinner label="Loading your studios…" />
      ) : studios.isError ? (
        <ApiProblem error={studios.error} what="your studios" onRetry={() => studios.refetch()} />
      ) : (
        <div className="space-y-8">
          {justCreated && (
            <Alert tone="success" title="Your studio is set up as a draft">
              Next add a kiln and post a firing, then publish it so potters can find it.
            </Alert>
          )}
          {(studios.data.length === 0 || adding) &&
            (isStudioOwner ? (
              <Card className="max-w-xl">
                <h2 className="text-lg font-semibold">Set up your studio</h2>
                <p className="mt-1 text-sm text-slip-600">
                  A name and where it is are enough to begin. It stays a draft, seen only by you, until you publish it.
                </p>
                <div className="mt-4">
                  <StudioCreateForm
                    onCreated={(studio) => {
                      setAdding(false)
                      setJustCreated(studio.id)
                    }}
                  />
                </div>
              </Card>
            ) : (
              <EmptyState title="You are not on a studio’s crew yet">
                Crew accounts join a studio through the owner’s invitation. If your invitation link has expired, ask the owner to send a new
                one.
              </EmptyState>
            ))}
          {studios.data.map((studio) => (
            <StudioPanel key={studio.id} studio={studio} />
          ))}
        </div>
      )}
    </>
  )
}

function StudioPanel({ studio }: { studio: MemberStudio }) {
  const [from] = useState(() => new Date().toISOString())
  const kilns = useStudioKilns(studio.id)
  const firings = useStudioFirings(studio.id, { from })
  const publish = useUpdateStudio(studio.id)
  const waiting = useWaitingRequests(studio.id)
  const [posting, setPosting] = useState(false)
  const dialog = useSelectedFiring(firings.data)
  const isOwner = studio.myRole === 'owner'
  const liveKilns = kilns.data?.filter((k) => !k.retired) ?? []
  const kilnName = (id: string) => kilns.data?.find((k) => k.id === id)?.name ?? 'Kiln'
  const upcoming = firings.data?.slice(0, UPCOMING_SHOWN) ?? []
  const waitingLink = (firing: FiringRecord) => {
    const count = waiting.data?.perFiring.get(firing.id) ?? 0
    return count > 0 ? (
      <Link
        to={`/firings/${firing.id}/requests`}
        className="text-sm font-semibold text-clay-700 hover:underline"
        data-testid="waiting-requests"
      >
        {count} {count === 1 ? 'ask' : 'asks'} waiting
      </Link>
    ) : null
  }

  return (
    <section aria-labelledby={`studio-${studio.id}`} className="space-y-4" data-testid="studio-panel">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id={`studio-${studio.id}`} className="text-xl font-bold tracking-tight">
            {studio.name}
          </h2>
          <div className="mt-1 flex flex-wrap items-center gap-2 text-sm text-slip-600">
            {studio.published ? <Badge tone="celadon">Published</Badge> : <Badge tone="ember">Draft</Badge>}
            {studio.verified && <Badge tone="clay">Verified</Badge>}
            <Badge>{isOwner ? 'Owner' : 'Crew'}</Badge>
            <span>
              {[studio.city, studio.region].filter(Boolean).join(', ')} · times in {zoneName(studio.timezone)}
            </span>
          </div>
        </div>
        <div className="flex flex-wrap gap-2" role="group" aria-label={`Quick actions for ${studio.name}`}>
          <Button onClick={() => setPosting(true)} disabled={liveKilns.length === 0}>
            Post a firing
          </Button>
          <ButtonLink to={`/studios/${studio.id}/requests`} variant="secondary">
            Asks{waiting.data && waiting.data.total > 0 ? ` (${waiting.data.total} waiting)` : ''}
          </ButtonLink>
          <ButtonLink to={`/studios/${studio.id}/calendar`} variant="secondary">
            Open calendar
          </ButtonLink>
          {isOwner && (
            <>
              <ButtonLink to={`/studios/${studio.id}/kilns/new`} variant="secondary">
                Add a kiln
              </ButtonLink>
              <ButtonLink to={`/studios/${studio.id}/edit`} variant="secondary">
                Edit studio
              </ButtonLink>
              <ButtonLink to={`/studios/${studio.id}/crew`} variant="secondary">
                Crew
              </ButtonLink>
            </>
          )}
          <ButtonLink to={`/studios/${studio.id}`} variant="ghost">
            View public page
          </ButtonLink>
        </div>
      </div>

      {isOwner && !studio.published && (
        <Alert tone="warning" title="Potters cannot see this studio yet">
          <span>Publish it when its kilns and firings are ready. </span>
          <Button
            size="sm"
            variant="secondary"
            className="mt-2 sm:mt-0"
            busy={publish.isPending}
            onClick={() => publish.mutate({ published: true })}
          >
            Publish now
          </Button>
          {publish.isError && <span className="ml-2 text-danger-700">{publish.error.message}</span>}
        </Alert>
      )}

      <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="space-y-2">
          <h3 className="text-sm font-semibold uppercase tracking-wide text-slip-600">Coming firings</h3>
          {firings.isPending ? (
            <Spinner label="Loading firings…" />
          ) : firings.isError ? (
            <ApiProblem error={firings.error} what="the firings" onRetry={() => firings.refetch()} />
          ) : upcoming.length === 0 ? (
            <EmptyState
              title="No firings coming up"
              action={
                liveKilns.length > 0 ? (
                  <Button variant="secondary" onClick={() => setPosting(true)}>
                    Post a firing
                  </Button>
                ) : undefined
              }
            >
              {liveKilns.length === 0
                ? 'Add a kiln first; firings are posted per kiln.'
                : 'Post one, or a repeating series, for potters to ask for space in.'}
            </EmptyState>
          ) : (
            <>
              <FiringRows firings={upcoming} kilnName={kilnName} zone={studio.timezone} onOpen={dialog.open} extra={waitingLink} />
              {firings.data.length > UPCOMING_SHOWN && (
                <Link to={`/studios/${studio.id}/calendar`} className="text-sm font-medium text-clay-700 hover:underline">
                  {firings.data.length - UPCOMING_SHOWN} more in the calendar
                </Link>
              )}
            </>
          )}
        </div>
        <Card as="div" className="h-fit">
          <h3 className="text-sm font-semibold uppercase tracking-wide text-slip-600">Kilns</h3>
          {kilns.isPending ? (
            <Spinner />
          ) : kilns.isError ? (
            <ApiProblem error={kilns.error} what="the kilns" />
          ) : kilns.data.length === 0 ? (
            <p className="mt-2 text-sm text-slip-600">
              No kilns yet.{' '}
              {isOwner && (
                <Link to={`/studios/${studio.id}/kilns/new`} className="font-medium text-clay-700 hover:underline">
                  Add the first one
                </Link>
              )}
            </p>
          ) : (
            <ul className="mt-2 space-y-2 text-sm">
              {kilns.data.map((kiln) => (
                <li key={kiln.id} className="flex items-center justify-between gap-2">
                  <Link to={`/kilns/${kiln.id}`} className="font-medium text-clay-700 hover:underline">
                    {kiln.name}
                  </Link>
                  {kiln.retired ? (
                    <Badge>Retired</Badge>
                  ) : !kiln.priceList ? (
                    <Badge tone="ember">No prices</Badge>
                  ) : (
                    <span className="text-xs text-slip-500">
                      cone {kiln.minCone}–{kiln.maxCone}
                    </span>
                  )}
                </li>
              ))}
            </ul>
          )}
        </Card>
      </div>

      <Dialog
        open={posting}
        onClose={() => setPosting(false)}
        title="Post a firing"
        description={`Times in ${zoneName(studio.timezone)}.`}
        size="lg"
      >
        <FiringForm
          studioId={studio.id}
          zone={studio.timezone}
          kilns={liveKilns}
          onCreated={() => setPosting(false)}
          onCancel={() => setPosting(false)}
        />
      </Dialog>
      <FiringDialog
        firing={dialog.selected}
        kilnName={dialog.selected ? kilnName(dialog.selected.kilnId) : ''}
        zone={studio.timezone}
        onClose={dialog.close}
      />
    </section>
  )
}
