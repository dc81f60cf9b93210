import { useState } from 'react'
import type { HurtAskJson, IncidentJson, RemedyJson } from '../../../../shared/api/incidents'
import { formatDate, formatDateTime, formatMoney } from '../../../../shared/dates'
import { formatCone } from '../../../../shared/firing/cones'
import { REMEDY_KINDS, REMEDY_LABELS, type RemedyKind } from '../../../../shared/remedies'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { moneyMeasure, parseShown } from '../../../lib/units'
import { useMakeGood } from '../api/incidents'

/** One remedy in words: how much went back and how, or which pieces are refired and where. */
function RemedyLine({ remedy, timezone, showPotter }: { remedy: RemedyJson; timezone: string; showPotter: boolean }) {
  const money = (cents: number | null) => formatMoney(cents ?? 0, remedy.currency ?? 'USD')
  const how = [
    (remedy.onlineCents ?? 0) > 0 ? `${money(remedy.onlineCents)} refunded to the card` : '',
    (remedy.counterCents ?? 0) > 0 ? `${money(remedy.counterCents)} handed back at the studio’s counter` : '',
  ].filter(Boolean)
  return (
    <li className="rounded-control border border-slip-200 p-3 text-sm" data-testid="remedy">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="font-semibold text-slip-900">
          {remedy.kind === 'credit' ? `Credit of ${money(remedy.amountCents)}` : 'Refire free'}
          {showPotter && <span className="font-normal text-slip-700"> for {remedy.potterName}</span>}
        </p>
        <Badge tone="celadon">{REMEDY_LABELS[remedy.kind]}</Badge>
      </div>
      {remedy.kind === 'credit' ? (
        <p className="mt-1 text-slip-800">{`${how.join('; ')}.`}</p>
      ) : (
        <p className="mt-1 text-slip-800">
          <span className="font-mono">{remedy.pieceTags.join(', ')}</span>{' '}
          {remedy.targetFiring
            ? `in the ${remedy.targetFiring.kilnName} firing of ${formatDate(remedy.targetFiring.date, timezone)}`
            : 'in a coming firing, to be named'}
        </p>
      )}
      {remedy.note && <p className="mt-1 text-slip-700">The studio: “{remedy.note}”</p>}
      <p className="mt-1 text-xs text-slip-500">{formatDateTime(remedy.at, timezone)}</p>
    </li>
  )
}

/** The owner's form for one hurt potter: a credit on their ask or a free refire of their hurt pieces. */
function MakeGoodForm({ incident, ask }: { incident: IncidentJson; ask: HurtAskJson }) {
  const makeGood = useMakeGood(incident)
  const open = REMEDY_KINDS.filter((k) => !ask.given.includes(k))
  const [picked, setKind] = useState<RemedyKind>(open[0] ?? 'refire')
  // Once one kind is given, the form offers the other.
  const kind = open.includes(picked) ? picked : (open[0] ?? picked)
  const [amount, setAmount] = useState('')
  const [tags, setTags] = useState<string[]>(() => ask.pieces.map((p) => p.tag))
  const [firingId, setFiringId] = useState('')
  const [note, setNote] = useState('')
  const measure = moneyMeasure(ask.currency)
  const error = makeGood.error instanceof ApiError ? makeGood.error : null
  const fieldError = (name: string) =>
    error?.fields?.[name] ?? Object.entries(error?.fields ?? {}).find(([key]) => key.startsWith(`${name}.`))?.[1]
  const shownFieldErrors = ['amountCents', 'tags', 'firingId', 'note'].some((name) => fieldError(name))
  if (!open.length) return null
  const creditBlocked = kind === 'credit' ? ask.creditBlocked : null
  const groupName = `remedy-kind-${ask.requestId}`
  return (
    <form
      className="mt-3 space-y-3"
      aria-label={`Make good to ${ask.potterName}`}
      noValidate
      onSubmit={(event) => {
        event.preventDefault()
        const shown = parseShown(amount)
        const body =
          kind === 'credit'
            ? {
                requestId: ask.requestId,
                kind,
                ...(shown === undefined || Number.isNaN(shown) ? {} : { amountCents: measure.fromShown(shown) }),
                note,
              }
            : { requestId: ask.requestId, kind, tags, ...(firingId ? { firingId } : {}), note }
        // What was typed stays in the form when the server refuses it; it is cleared once given.
        makeGood.mutate(body, {
          onSuccess: () => {
            setAmount('')
            setNote('')
          },
        })
      }}
    >
      <fieldset>
        <legend className="text-sm font-medium text-slip-800">How to make good</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {open.map((k) => (
            <label key={k} className="flex items-center gap-2 text-sm text-slip-800">
              <input
                type="radio"
                name={groupName}
                value={k}
                checked={kind === k}
                onChange={() => setKind(k)}
                className="focus-ring size-4 accent-clay-600"
              />
              {REMEDY_LABELS[k]}
            </label>
          ))}
        </div>
      </fieldset>
      {kind === 'credit' ? (
        creditBlocked ? (
          <Alert tone="info">{creditBlocked}</Alert>
        ) : (
          <Field
            label={`Amount to give back (${ask.currency})`}
            hint={`At most ${formatMoney(ask.creditableCents, ask.currency)}: what ${ask.potterName} paid on this ask and has not had back. Paid online, it goes back to the card; paid at the counter, you hand it back there.`}
            error={fieldError('amountCents')}
          >
            {(a11y) => (
              <TextInput
                {...a11y}
                inputMode="decimal"
                autoComplete="off"
                className="sm:w-40"
                value={amount}
                onChange={(e) => setAmount(e.target.value)}
              />
            )}
          </Field>
        )
      ) : (
        <>
          <fieldset>
            <legend className="text-sm font-medium text-slip-800">Pieces to refire free</legend>
            <div className="mt-1 space-y-1">
              {ask.pieces.map((piece) => (
                <Checkbox
                  key={piece.tag}
                  label={
                    <>
                      <span className="font-mono">{piece.tag}</span> {piece.label}
                    </>
                  }
                  checked={tags.includes(piece.tag)}
                  onChange={(e) => setTags(e.target.checked ? [...tags, piece.tag] : tags.filter((t) => t !== piece.tag))}
                />
              ))}
            </div>
            {fieldError('tags') && (
              <p className="mt-1 text-xs font-medium text-danger-700" role="alert">
                {fieldError('tags')}
              </p>
            )}
          </fieldset>
          <Field label="In which firing" hint="Optional: name one of your coming firings now, or say later." error={fieldError('firingId')}>
            {(a11y) => (
              <Select {...a11y} value={firingId} onChange={(e) => setFiringId(e.target.value)}>
                <option value="">Not chosen yet</option>
                {incident.comingFirings.map((f) => (
                  <option key={f.id} value={f.id}>
                    {formatDate(f.date, incident.timezone)}: {f.kilnName}, {formatCone(f.cone)} {f.firingKind}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        </>
      )}
      <Field label={`Note for ${ask.potterName} (optional)`} error={fieldError('note')}>
        {(a11y) => <TextArea {...a11y} rows={2} maxLength={2000} value={note} onChange={(e) => setNote(e.target.value)} />}
      </Field>
      {error && !shownFieldErrors && <Alert tone="danger">{error.message}</Alert>}
      <Button type="submit" busy={makeGood.isPending} disabled={Boolean(creditBlocked)}>
        {kind === 'credit' ? 'Give the credit' : 'Promise the refire'}
      </Button>
    </form>
  )
}

/**
 * Making good to potters whose pieces the incident hurt: for the studio's owner, each hurt potter's
 * pieces with their photos, what was already done and the form; for a hurt potter, what the studio did
 * for them.
 */
export function MakeGood({ incident }: { incident: IncidentJson }) {
  const studioSide = incident.viewerSide === 'studio' || incident.viewerSide === 'admin'
  if (!incident.canMakeGood && !incident.remedies.length && incident.viewerSide !== 'neighbour') return null
  return (
    <Card>
      <h2 className="text-lg font-semibold text-slip-900">
        {studioSide ? 'Make good to hurt potters' : 'What the studio did for your pieces'}
      </h2>
      {incident.canMakeGood ? (
        <>
          <p className="mt-1 text-sm text-slip-700">
            Give money back on a hurt potter’s own ask, or promise to refire their pieces free. Each is on their ask’s timeline and they are
            told by mail.
          </p>
          {incident.hurtAsks.length === 0 && <p className="mt-2 text-sm text-slip-700">No other potter’s pieces were named as hurt.</p>}
          <ul className="mt-3 space-y-4">
            {incident.hurtAsks.map((ask) => (
              <li key={ask.requestId} className="rounded-control border border-slip-200 p-4" data-testid="hurt-ask">
                <h3 className="font-semibold text-slip-900">{ask.potterName}</h3>
                <ul className="mt-1 space-y-2 text-sm" aria-label={`${ask.potterName}’s hurt pieces`}>
                  {ask.pieces.map((piece) => (
                    <li key={piece.tag}>
                      <span className="font-mono">{piece.tag}</span> {piece.label}
                      {piece.photos.length > 0 && (
                        <div className="mt-1">
                          <PhotoGallery photos={piece.photos} headingLevel="h4" />
                        </div>
                      )}
                    </li>
                  ))}
                </ul>
                {incident.remedies.some((r) => r.requestId === ask.requestId) && (
                  <ul className="mt-3 space-y-2" aria-label={`Done for ${ask.potterName}`}>
                    {incident.remedies
                      .filter((r) => r.requestId === ask.requestId)
                      .map((remedy) => (
                        <RemedyLine key={remedy.id} remedy={remedy} timezone={incident.timezone} showPotter={false} />
                      ))}
                  </ul>
                )}
                <MakeGoodForm incident={incident} ask={ask} />
              </li>
            ))}
          </ul>
        </>
      ) : incident.remedies.length ? (
        <ul className="mt-3 space-y-2">
          {incident.remedies.map((remedy) => (
            <RemedyLine key={remedy.id} remedy={remedy} timezone={incident.timezone} showPotter={studioSide} />
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm text-slip-700">The studio has not yet said whether it will credit or refire your pieces.</p>
      )}
    </Card>
  )
}
