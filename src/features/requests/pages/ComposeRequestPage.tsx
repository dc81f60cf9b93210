import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { useNavigate, useParams, useSearchParams } from 'react-router-dom'
import { takesRequests } from '../../../../shared/workflow/firing-status'
import { SafetyNote } from '../../../components/SafetyNote'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Field, TextArea } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { CheckCard, VerdictBar } from '../../../components/ware/CheckCard'
import { FindingsList } from '../../../components/ware/CheckResults'
import { ConeSuggestions } from '../../../components/ware/ConeField'
import { PieceRows } from '../../../components/ware/PieceRows'
import { QuoteSummary } from '../../../components/ware/QuoteSummary'
import { ApiError } from '../../../lib/api'
import { newPiece, pieceDraftOf } from '../../../lib/pieceDraft'
import type { UnitSystem } from '../../../lib/units'
import type { PriceList } from '../../../../shared/firing/quote'
import { useMe } from '../../auth/api/auth'
import { useFiring, useKiln, usePriceList, useStudio } from '../api/firings'
import { useRequest, useSaveDraft } from '../api/requests'
import type { FiringRecord, KilnRecord, RequestView, StudioRecord } from '../api/types'
import { FiringSummary } from '../components/FiringSummary'
import { RequestProblem } from '../components/RequestProblem'
import { SendDialog } from '../components/SendDialog'
import { SpaceGauge } from '../components/SpaceGauge'
import { WarePhotos } from '../components/WarePhotos'
import { checkAgainst, parseCompose, type ComposeValues } from '../composeForm'

const CHECK_ID = 'request-check'

/** /firings/:firingId/request (and ?draft=id to carry on with a saved draft). */
export function ComposeRequestPage() {
  const { firingId = '' } = useParams()
  const [params] = useSearchParams()
  const draftId = params.get('draft')
  const me = useMe()
  const firing = useFiring(firingId)
  const kiln = useKiln(firing.data?.kilnId)
  const priceList = usePriceList(firing.data?.kilnId)
  const studio = useStudio(firing.data?.studioId)
  const draft = useRequest(draftId ?? undefined)
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'

  if (firing.isError)
    return (
      <RequestProblem
        error={firing.error}
        what="this firing"
        onRetry={() => firing.refetch()}
        back={{ to: '/find', label: 'Find another firing' }}
      />
    )
  const failed = [kiln, priceList, studio, draft].find((query) => query.isError)
  if (failed)
    return <RequestProblem error={failed.error} what={failed === draft ? 'your draft' : 'this firing'} onRetry={() => failed.refetch()} />
  if (firing.isPending || !kiln.data || priceList.data === undefined || !studio.data || (draftId && draft.isPending))
    return <Spinner label="Loading the firing…" />

  if (draft.data && draft.data.state !== 'draft') {
    return (
      <EmptyState title="This ask has been sent" action={<ButtonLink to={`/requests/${draft.data.id}`}>Open your ware’s page</ButtonLink>}>
        A sent ask can no longer be changed. Message the studio from your ware’s page if something is different.
      </EmptyState>
    )
  }
  if (!takesRequests(firing.data.status) || new Date(firing.data.dropOffBy).getTime() < Date.now()) {
    return (
      <EmptyState
        title="This firing is not taking ware any more"
        action={<ButtonLink to={`/studios/${firing.data.studioId}`}>See the studio’s other firings</ButtonLink>}
      >
        It is full, closed or past its drop-off deadline.
      </EmptyState>
    )
  }
  return (
    <ComposeForm
      firing={firing.data}
      kiln={kiln.data}
      priceList={priceList.data}
      studio={studio.data}
      draft={draft.data ?? null}
      units={units}
    />
  )
}

interface ComposeFormProps {
  firing: FiringRecord
  kiln: KilnRecord
  priceList: PriceList | null
  studio: StudioRecord
  draft: RequestView | null
  units: UnitSystem
}

function ComposeForm({ firing, kiln, priceList, studio, draft, units }: ComposeFormProps) {
  const navigate = useNavigate()
  const [, setParams] = useSearchParams()
  const { control, register, watch, reset, formState } = useForm<ComposeValues>({
    defaultValues: draft ? { pieces: draft.pieces.map(pieceDraftOf), notes: draft.notes } : { pieces: [newPiece()], notes: '' },
  })
  const values = watch()
  const parsed = parseCompose(values, units)
  const outcome = parsed.pieces ? checkAgainst(firing, kiln, priceList, parsed.pieces) : null
  const result = outcome !== null && typeof outcome !== 'string' ? outcome : null
  const [draftId, setDraftId] = useState(draft?.id ?? null)
  const [sendingId, setSendingId] = useState<string | null>(null)
  const [serverBlocked, setServerBlocked] = useState<RequestView | null>(null)
  const [intent, setIntent] = useState<'save' | 'send'>('save')
  const save = useSaveDraft(firing.id)
  const canSave = parsed.pieces !== null && !parsed.messages.notes
  const blocked = result?.check.verdict === 'block'

  const saveDraft = (then?: (view: RequestView) => void) => {
    if (!parsed.pieces) return
    setServerBlocked(null)
    setIntent(then ? 'send' : 'save')
    save.mutate(
      { id: draftId, body: { pieces: parsed.pieces, notes: parsed.notes } },
      {
        onSuccess: (view) => {
          setDraftId(view.id)
          setParams({ draft: view.id }, { replace: true })
          reset(structuredClone(values))
          then?.(view)
        },
      },
    )
  }

  const startSending = () =>
    saveDraft((view) => {
      // The server's check of the saved draft is the one that counts.
      if (view.verdict === 'block') setServerBlocked(view)
      else setSendingId(view.id)
    })

  return (
    <>
      <PageHeader
        title={`Ask for space at ${studio.name}`}
        lead="Describe what you will bring. The check, the price and the space it takes update as you type; the studio sees the same."
        actions={draftId && !formState.isDirty ? <Badge tone="neutral">Draft saved</Badge> : undefined}
      />
      <ConeSuggestions />
      <Card className="mb-6">
        <h2 className="mb-3 text-lg font-semibold">The firing</h2>
        <FiringSummary firing={firing} kiln={kiln} studio={studio} units={units} />
      </Card>

      <div className="grid gap-6 pb-20 lg:grid-cols-[minmax(0,1fr)_24rem] lg:items-start lg:pb-0">
        <form className="min-w-0 space-y-6" noValidate onSubmit={(event) => event.preventDefault()} aria-label="Your pieces">
          <PieceRows control={control} register={register} messages={parsed.messages} units={units} title="Your pieces" />
          <Card>
            <Field
              label="Notes for the studio"
              hint="Optional: anything the studio should know (a glaze they should see first, when you can drop off)."
              error={parsed.messages.notes}
            >
              {(a11y) => <TextArea {...a11y} rows={4} {...register('notes')} />}
            </Field>
          </Card>
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Photos of your ware</h2>
            {draftId ? (
              <DraftPhotos draftId={draftId} />
            ) : (
              <p className="text-sm text-slip-600">
                Save the draft first, then add photos: they help the studio see the glazed feet and any runny glaze before it says yes.
              </p>
            )}
          </Card>
          <div className="space-y-3">
            {save.isError && (
              <Alert tone="danger" title="Not saved">
                {save.error instanceof ApiError ? save.error.message : 'Something went wrong. Please try again.'}
              </Alert>
            )}
            {serverBlocked && (
              <Alert tone="danger" title="Conewright’s check blocks this ware">
                <p>Change what is marked and try again.</p>
                <div className="mt-2">
                  <FindingsList findings={serverBlocked.findings.filter((f) => f.severity === 'block')} pieces={serverBlocked.pieces} />
                </div>
              </Alert>
            )}
            <div className="flex flex-wrap items-center gap-3">
              <Button variant="secondary" onClick={() => saveDraft()} busy={save.isPending && intent === 'save'} disabled={!canSave}>
                Save draft
              </Button>
              <Button onClick={startSending} disabled={!canSave || blocked} busy={save.isPending && intent === 'send'}>
                Send…
              </Button>
              {draftId && (
                <span className="text-sm text-slip-600">
                  {formState.isDirty ? 'Changes not saved yet.' : 'Saved. Your drafts are in My ware.'}
                </span>
              )}
            </div>
            {!canSave && <p className="text-sm text-slip-600">Fix the fields marked in red to save or send.</p>}
            {blocked && (
              <p className="text-sm text-slip-600">
                The check blocks this ware in this firing: change what it says, or choose another firing.
              </p>
            )}
          </div>
        </form>

        <div className="min-w-0 space-y-6 lg:sticky lg:top-4">
          <CheckCard
            id={CHECK_ID}
            check={result?.check ?? null}
            problem={typeof outcome === 'string' ? outcome : null}
            pieces={parsed.pieces ?? []}
          >
            {result && <SpaceGauge need={result.check.fit.shelvesNeeded} left={result.check.fit.shelvesLeft ?? firing.space.shelvesLeft} />}
          </CheckCard>
          <Card>
            <h2 className="mb-3 text-lg font-semibold text-slip-900">Quote</h2>
            {!priceList ? (
              <p className="text-sm text-slip-600">This kiln has no price list yet; the studio quotes when it answers.</p>
            ) : result?.quote ? (
              <QuoteSummary quote={result.quote} />
            ) : result?.quoteProblem ? (
              <Alert tone="warning">{result.quoteProblem}</Alert>
            ) : (
              <p className="text-sm text-slip-600">Fill in the pieces to see the price.</p>
            )}
            {priceList && (
              <p className="mt-3 text-xs text-slip-500">From the studio’s price list. The deposit is paid once the studio accepts.</p>
            )}
          </Card>
          <SafetyNote />
        </div>
      </div>

      <VerdictBar verdict={result?.check.verdict ?? null} checkId={CHECK_ID} />

      <SendDialog requestId={sendingId} onClose={() => setSendingId(null)} onSent={(view) => navigate(`/requests/${view.id}`)} />
    </>
  )
}

/** The saved draft's photos; they stay with the ask when it is sent. */
function DraftPhotos({ draftId }: { draftId: string }) {
  const draft = useRequest(draftId)
  if (draft.isPending) return <Spinner label="Loading your photos…" />
  if (draft.isError) return <RequestProblem error={draft.error} what="your photos" onRetry={() => draft.refetch()} />
  return <WarePhotos view={draft.data} />
}
