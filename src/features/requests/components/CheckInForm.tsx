import { useState } from 'react'
import { useForm, useWatch, type Control, type UseFormRegister } from 'react-hook-form'
import { formatMoney } from '../../../../shared/dates'
import { checkInSchema } from '../../../../shared/schemas/pickup'
import { PhotoUploader } from '../../../components/photos/PhotoUploader'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Dialog } from '../../../components/ui/Dialog'
import { Checkbox, Field, TextArea } from '../../../components/ui/Field'
import { MeasureField } from '../../../components/ui/MeasureField'
import { pieceName } from '../../../components/ware/CheckResults'
import { ApiError } from '../../../lib/api'
import { COUNT, lengthMeasure, localiseMessage, type UnitSystem } from '../../../lib/units'
import { useCheckIn, useRefreshPhotos, type CheckInBody } from '../api/pickup'
import type { RequestView } from '../api/types'
import { pieceSizeInWords, refundIfWithdrawn } from '../requestWords'

interface PieceValues {
  received: number | undefined
  differs: boolean
  heightMm: number | undefined
  widthMm: number | undefined
  depthMm: number | undefined
}

interface CheckInValues {
  pieces: PieceValues[]
  conditionNotes: string
}

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

/** The schema's messages placed on the form's own fields (a measured size sits beside its piece). */
function messagesOf(issues: readonly { path: PropertyKey[]; message: string }[], units: UnitSystem): Record<string, string> {
  const messages: Record<string, string> = {}
  for (const issue of issues) {
    const [top, index, field, size] = issue.path
    const key =
      top === 'pieces' && typeof index === 'number'
        ? `pieces.${index}.${field === 'measured' ? String(size) : String(field)}`
        : String(top ?? '_')
    messages[key] ??= localiseMessage(issue.message, units)
  }
  return messages
}

/**
 * Check-in at the door: how many of each declared piece came in, the measured size where it differs
 * (the server re-runs the check and the price), the condition they came in, and photos. Or refuse
 * the ware with a reason.
 */
export function CheckInForm({ view, units }: { view: RequestView; units: UnitSystem }) {
  const checkIn = useCheckIn(view.id)
  const refreshPhotos = useRefreshPhotos(view.id)
  const [messages, setMessages] = useState<Record<string, string>>({})
  const [refusing, setRefusing] = useState(false)
  const { control, register, handleSubmit } = useForm<CheckInValues>({
    defaultValues: {
      pieces: view.pieces.map((piece) => ({
        received: piece.quantity,
        differs: false,
        heightMm: piece.heightMm,
        widthMm: piece.widthMm,
        depthMm: piece.depthMm,
      })),
      conditionNotes: '',
    },
  })

  const submit = handleSubmit((values) => {
    const body: CheckInBody = {
      pieces: values.pieces.map((p, pieceIndex) => {
        const round = view.pieces[pieceIndex]?.round
        return {
          pieceIndex,
          received: p.received as number,
          ...(p.differs
            ? {
                measured: {
                  heightMm: p.heightMm as number,
                  widthMm: p.widthMm as number,
                  depthMm: (round ? p.widthMm : p.depthMm) as number,
                },
              }
            : {}),
        }
      }),
      ...(values.conditionNotes.trim() ? { conditionNotes: values.conditionNotes.trim() } : {}),
    }
    const parsed = checkInSchema.safeParse(body)
    if (!parsed.success) return setMessages(messagesOf(parsed.error.issues, units))
    setMessages({})
    checkIn.mutate(parsed.data, {
      onError: (error) => {
        if (error instanceof ApiError)
          setMessages(
            Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k.replace(/\.measured\./, '.'), localiseMessage(v, units)])),
          )
      },
    })
  })

  return (
    <>
      <form onSubmit={submit} noValidate className="space-y-5" aria-label="Take the ware in" data-testid="check-in-form">
        <p className="text-sm text-slip-700">
          Count what came in against what was declared. Measure a piece only if it looks bigger or smaller than the potter declared: the
          check and the price are worked out again from what you enter.
        </p>
        <div className="space-y-3">
          {view.pieces.map((piece, index) => (
            <PieceCheckIn key={index} index={index} view={view} control={control} register={register} messages={messages} units={units} />
          ))}
          {messages.pieces && (
            <p className="text-sm font-medium text-danger-700" role="alert">
              {messages.pieces}
            </p>
          )}
        </div>
        <Field
          label="Condition at drop-off"
          hint="Cracks, chips or anything else already there, so nobody blames the firing for it later."
          error={messages.conditionNotes}
        >
          {(a11y) => <TextArea {...a11y} rows={3} {...register('conditionNotes')} />}
        </Field>
        <PhotoUploader
          uploadUrl={`/api/requests/${view.id}/photos`}
          fields={{ kind: 'check-in' }}
          label="Drop-off photos"
          hint="A photo of the ware as it came in, especially of any damage."
          onUploaded={() => void refreshPhotos()}
        />
        {checkIn.isError && (
          <Alert tone="danger" title="Not taken in">
            {problemOf(checkIn.error)}
          </Alert>
        )}
        <div className="flex flex-wrap items-center gap-2">
          <Button type="submit" busy={checkIn.isPending}>
            Take the ware in
          </Button>
          <button
            type="button"
            onClick={() => setRefusing(true)}
            className="rounded-control px-4 py-2.5 text-sm font-semibold text-danger-700 hover:bg-danger-50"
          >
            Refuse at the door…
          </button>
        </div>
      </form>
      <RefuseDialog view={view} open={refusing} onClose={() => setRefusing(false)} />
    </>
  )
}

interface PieceCheckInProps {
  index: number
  view: RequestView
  control: Control<CheckInValues>
  register: UseFormRegister<CheckInValues>
  messages: Record<string, string>
  units: UnitSystem
}

function PieceCheckIn({ index, view, control, register, messages, units }: PieceCheckInProps) {
  const piece = view.pieces[index]
  const values = useWatch({ control, name: `pieces.${index}` })
  const name = pieceName(view.pieces, index)
  const length = lengthMeasure(units)
  const at = `pieces.${index}` as const
  const short = values.received !== undefined && !Number.isNaN(values.received) && values.received < piece.quantity
  return (
    <fieldset className="rounded-control border border-slip-200 p-4" data-testid="check-in-piece">
      <legend className="px-1 text-sm font-semibold text-slip-800">{name}</legend>
      <p className="mb-3 text-sm text-slip-600">
        Declared: {piece.quantity} × {pieceSizeInWords(piece, units)}
      </p>
      <div className="grid gap-3 sm:grid-cols-[10rem_1fr] sm:items-end">
        <MeasureField
          control={control}
          name={`${at}.received`}
          label="Received"
          measure={COUNT}
          units={units}
          error={messages[`${at}.received`]}
          hint={`of ${piece.quantity} declared`}
        />
        <div className="pb-2">
          <Checkbox label="Measured size differs from what was declared" {...register(`${at}.differs`)} />
        </div>
      </div>
      {short && <p className="mt-2 text-sm text-ember-700">Fewer than declared: the price is worked out for what came in.</p>}
      {values.differs && (
        <div className="mt-3 grid gap-3 border-l-2 border-clay-100 pl-3 sm:grid-cols-3">
          <MeasureField
            control={control}
            name={`${at}.heightMm`}
            label="Measured height"
            measure={length}
            units={units}
            error={messages[`${at}.heightMm`]}
          />
          <MeasureField
            control={control}
            name={`${at}.widthMm`}
            label={piece.round ? 'Measured diameter' : 'Measured width'}
            measure={length}
            units={units}
            error={messages[`${at}.widthMm`]}
          />
          {!piece.round && (
            <MeasureField
              control={control}
              name={`${at}.depthMm`}
              label="Measured depth"
              measure={length}
              units={units}
              error={messages[`${at}.depthMm`]}
            />
          )}
        </div>
      )}
    </fieldset>
  )
}

/** Turning the ware away: the reason and photos are kept, and the potter is refunded under the studio's terms. */
function RefuseDialog({ view, open, onClose }: { view: RequestView; open: boolean; onClose: () => void }) {
  const checkIn = useCheckIn(view.id)
  const refreshPhotos = useRefreshPhotos(view.id)
  const [reason, setReason] = useState('')
  const [notes, setNotes] = useState('')
  const [touched, setTouched] = useState(false)
  const body: CheckInBody = { pieces: [], refuse: { reason: reason.trim() }, ...(notes.trim() ? { conditionNotes: notes.trim() } : {}) }
  const parsed = checkInSchema.safeParse(body)
  const reasonError = parsed.success ? undefined : parsed.error.issues.find((i) => i.path[0] === 'refuse')?.message
  const paid = view.price.netPaidCents
  const currency = view.price.currency
  const refund = refundIfWithdrawn(paid, view.firing.firingDate, view.studio.policies.cancellation)
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Refuse the ware at the door?"
      description="The ware’s place in the firing is called off and the potter is told why by mail."
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Go back
          </Button>
          <Button
            variant="danger"
            busy={checkIn.isPending}
            onClick={() => {
              setTouched(true)
              if (parsed.success) checkIn.mutate(parsed.data, { onSuccess: onClose })
            }}
          >
            Refuse the ware
          </Button>
        </>
      }
    >
      <div className="space-y-4">
        <Alert tone="warning" title="Under your terms">
          {paid > 0
            ? `The potter gets ${formatMoney(refund.refundCents, currency)} back of the ${formatMoney(paid, currency)} paid.`
            : 'Nothing has been paid, so nothing is refunded.'}
        </Alert>
        <Field
          label="Why it is refused"
          hint="For example: greenware still damp to the touch; a crack through the foot; not the pieces declared."
          error={touched ? reasonError : undefined}
        >
          {(a11y) => (
            <TextArea
              {...a11y}
              rows={3}
              value={reason}
              onChange={(event) => setReason(event.target.value)}
              onBlur={() => setTouched(true)}
            />
          )}
        </Field>
        <Field label="Condition notes (optional)">
          {(a11y) => <TextArea {...a11y} rows={2} value={notes} onChange={(event) => setNotes(event.target.value)} />}
        </Field>
        <PhotoUploader
          uploadUrl={`/api/requests/${view.id}/photos`}
          fields={{ kind: 'refusal' }}
          label="Photos of the refused ware"
          hint="What you saw at the door, for the record."
          onUploaded={() => void refreshPhotos()}
        />
        {checkIn.isError && <Alert tone="danger">{problemOf(checkIn.error)}</Alert>}
      </div>
    </Dialog>
  )
}
