import { useState } from 'react'
import { useNavigate, useParams } from 'react-router-dom'
import { Alert } from '../../../components/ui/Alert'
import { Button, ButtonLink } from '../../../components/ui/Button'
import { Card, PageHeader } from '../../../components/ui/Card'
import { Dialog } from '../../../components/ui/Dialog'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { useMe } from '../../auth/api/auth'
import { useCreateKiln, useRemoveKiln, useUpdateKiln } from '../api/kilns'
import { useStudio } from '../api/studios'
import { isMemberView, type KilnRecord, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { KilnForm, NEW_KILN, type KilnInput } from '../components/KilnForm'
import { KilnGate, KilnTitle } from '../components/KilnGate'
import { StudioNav } from '../components/StudioNav'

function kilnFormValues(kiln: KilnRecord): KilnInput {
  return {
    name: kiln.name,
    kind: kiln.kind,
    atmospheres: kiln.atmospheres,
    interior: kiln.interior,
    usableHeightMm: kiln.usableHeightMm,
    minCone: kiln.minCone,
    maxCone: kiln.maxCone,
    maxTempC: kiln.maxTempC,
    maxRampCPerHour: kiln.maxRampCPerHour,
    preheatHold: kiln.preheatHold,
    controlledCooling: kiln.controlledCooling,
    shelfCount: kiln.shelfCount,
    shelfWidthMm: kiln.shelfWidthMm,
    shelfDepthMm: kiln.shelfDepthMm,
    notes: kiln.notes,
  }
}

/** /studios/:id/kilns/new: the owner describes a kiln; then sets its prices on the kiln's page. */
export function NewKilnPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  const me = useMe()
  const create = useCreateKiln(id)
  const navigate = useNavigate()
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" />
  const found = studio.data
  if (!isMemberView(found) || found.myRole !== 'owner') {
    return (
      <Alert tone="warning" title="Only the studio’s owner adds kilns">
        Crew can post firings in the kilns the owner has added.
      </Alert>
    )
  }
  return (
    <>
      <PageHeader title="Add a kiln" lead={`To ${found.name}. Give its real limits: potters’ ware is checked against them.`} />
      <StudioNav studioId={found.id} role="owner" />
      <KilnForm
        defaultValues={NEW_KILN}
        initialUnits={me.data?.unitSystem ?? 'imperial'}
        submitLabel="Add the kiln"
        onSubmit={async (body) => {
          const kiln = await create.mutateAsync(body)
          navigate(`/kilns/${kiln.id}`)
        }}
      />
    </>
  )
}

/** /kilns/:id/edit: the kiln's limits; the owner changes them, crew read them. */
export function KilnEditorPage() {
  const { id = '' } = useParams()
  return <KilnGate kilnId={id}>{(kiln, studio) => <KilnEditor key={kiln.id} kiln={kiln} studio={studio} />}</KilnGate>
}

function KilnEditor({ kiln, studio }: { kiln: KilnRecord; studio: MemberStudio }) {
  const me = useMe()
  const update = useUpdateKiln(kiln.id, studio.id)
  const isOwner = studio.myRole === 'owner'
  return (
    <>
      <PageHeader
        title={<KilnTitle kiln={kiln} />}
        lead={
          isOwner
            ? 'Change what this kiln can do. Firings already posted keep their cone and atmosphere.'
            : 'What this kiln can do. Only the owner changes its limits.'
        }
        actions={
          <ButtonLink to={`/kilns/${kiln.id}`} variant="secondary">
            Kiln and prices
          </ButtonLink>
        }
      />
      <StudioNav studioId={studio.id} role={studio.myRole} />
      {!isOwner && (
        <Alert tone="info" className="mb-4" title="Read only">
          Kilns’ limits are the owner’s to set.
        </Alert>
      )}
      <KilnForm
        defaultValues={kilnFormValues(kiln)}
        initialUnits={me.data?.unitSystem ?? 'imperial'}
        submitLabel="Save the kiln"
        readOnly={!isOwner}
        onSubmit={(body) => update.mutateAsync(body)}
      />
      {isOwner && !kiln.retired && <RemoveKiln kiln={kiln} studioId={studio.id} />}
    </>
  )
}

function RemoveKiln({ kiln, studioId }: { kiln: KilnRecord; studioId: string }) {
  const remove = useRemoveKiln(kiln.id, studioId)
  const navigate = useNavigate()
  const [asking, setAsking] = useState(false)
  const blocked = remove.error instanceof ApiError && remove.error.code === 'has-upcoming-firings'
  return (
    <Card className="mt-8 border-danger-500/30">
      <h2 className="font-semibold">Take this kiln off the list</h2>
      <p className="mt-1 text-sm text-slip-600">
        A kiln that never fired is deleted. One with firings on record is retired: it stays in their history but takes no new firings.
      </p>
      {remove.isError && (
        <Alert tone={blocked ? 'warning' : 'danger'} className="mt-3">
          {remove.error.message}
        </Alert>
      )}
      <Button variant="danger" className="mt-3" onClick={() => setAsking(true)}>
        Remove the kiln…
      </Button>
      <Dialog
        open={asking}
        onClose={() => setAsking(false)}
        title={`Remove ${kiln.name}?`}
        footer={
          <>
            <Button variant="secondary" onClick={() => setAsking(false)}>
              Keep it
            </Button>
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() =>
                remove.mutate(undefined, {
                  onSuccess: () => navigate('/kiln-room'),
                  onSettled: () => setAsking(false),
                })
              }
            >
              Remove
            </Button>
          </>
        }
      >
        <p className="text-sm text-slip-700">Potters will no longer see it. This cannot be undone here.</p>
      </Dialog>
    </Card>
  )
}
