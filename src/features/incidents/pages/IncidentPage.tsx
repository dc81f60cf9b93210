import { useState } from 'react'
import { Link, useParams, useSearchParams } from 'react-router-dom'
import type { ClaimJson, IncidentJson } from '../../../../shared/api/incidents'
import { DAMAGE_CHARGE_KINDS, DAMAGE_CHARGE_LABELS, type DamageChargeKind } from '../../../../shared/claims'
import { formatDate, formatDateTime, formatMoney } from '../../../../shared/dates'
import { formatCone } from '../../../../shared/firing/cones'
import { CRACK_EDGES, type DiagnosisConfidence } from '../../../../shared/firing/incidents'
import { SafetyNote } from '../../../components/SafetyNote'
import { PhotoGallery } from '../../../components/photos/PhotoGallery'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card, PageHeader } from '../../../components/ui/Card'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { moneyMeasure, parseShown } from '../../../lib/units'
import { useContestClaim, useIncident, usePayClaim, useRaiseClaim } from '../api/incidents'
import { MakeGood } from '../components/MakeGood'

const CONFIDENCE_WORDS: Record<DiagnosisConfidence, string> = {
  high: 'Fairly sure: the firing’s log speaks for it',
  medium: 'Likely, from what was seen and the ware',
  low: 'Unsure: two phases are close; read the evidence below',
}

const EDGE_WORDS: Record<(typeof CRACK_EDGES)[number], string> = {
  sharp: 'Sharp and clean',
  rounded: 'Rounded, glaze flowed in',
  unknown: 'Not read',
}

const yes = (value: boolean) => (value ? 'Yes' : 'No')

function Facts({ incident }: { incident: IncidentJson }) {
  const rows: [string, string][] = [
    [
      'Reported by',
      `${incident.reporterName} (${incident.reportedBy === 'studio' ? 'studio' : 'potter'}), ${formatDateTime(incident.at, incident.timezone)}`,
    ],
    ['Ware of', incident.potterName],
    ...(incident.kind === 'crack' && incident.crackEdge ? [['Edge of the crack', EDGE_WORDS[incident.crackEdge]] as [string, string]] : []),
    ['Shards thrown', yes(incident.shards)],
    ['Other ware hit', yes(incident.neighboursHit)],
    ['Shelf damaged', yes(incident.shelfDamage)],
    ['Elements damaged', yes(incident.elementDamage)],
    ...(incident.whereInKiln ? [['Where in the kiln', incident.whereInKiln] as [string, string]] : []),
  ]
  return (
    <Card>
      <h2 className="text-lg font-semibold text-slip-900">What was seen</h2>
      <dl className="mt-3 grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[12rem_1fr]">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="font-medium text-slip-600">{label}</dt>
            <dd className="text-slip-900">{value}</dd>
          </div>
        ))}
      </dl>
      {incident.note && <p className="mt-3 text-sm text-slip-800">“{incident.note}”</p>}
      {incident.pieces.length > 0 && (
        <ul className="mt-3 space-y-1 text-sm" aria-label="Pieces">
          {incident.pieces.map((piece) => (
            <li key={piece.tag}>
              <span className="font-mono">{piece.tag}</span> {piece.label}, {piece.potterName}{' '}
              <Badge tone={piece.role === 'failed' ? 'danger' : 'ember'}>{piece.role === 'failed' ? 'Failed' : 'Hurt'}</Badge>
            </li>
          ))}
        </ul>
      )}
      <div className="mt-4">
        <PhotoGallery photos={incident.photos} kinds={['incident']} headings={{ incident: 'Photos' }} empty="No photos yet." />
      </div>
    </Card>
  )
}

function DiagnosisCard({ incident }: { incident: IncidentJson }) {
  const d = incident.diagnosis
  return (
    <Card>
      <h2 className="text-lg font-semibold text-slip-900">The likely phase</h2>
      {d.phase ? (
        <div className="mt-2 space-y-3" data-testid="diagnosis">
          <p className="text-base font-semibold text-clay-800">{d.label}</p>
          <p className="text-sm text-slip-700">{CONFIDENCE_WORDS[d.confidence]}</p>
          {!incident.logged && <p className="text-sm text-slip-600">The firing has no logged curve, so the log could not be read.</p>}
          <div>
            <h3 className="text-sm font-semibold text-slip-900">Why</h3>
            <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-800">
              {d.reasons.map((reason) => (
                <li key={reason}>{reason}</li>
              ))}
            </ul>
          </div>
          <div>
            <h3 className="text-sm font-semibold text-slip-900">Evidence for and against each phase</h3>
            <ul className="mt-1 space-y-2 text-sm">
              {d.candidates.map((c) => (
                <li key={c.phase} className="rounded-control border border-slip-200 p-3">
                  <p className="font-medium text-slip-900">{c.label}</p>
                  {c.for.length > 0 && (
                    <p className="mt-1 text-slip-800">
                      <span className="font-medium">For: </span>
                      {c.for.join(' ')}
                    </p>
                  )}
                  {c.against.length > 0 && (
                    <p className="mt-1 text-slip-700">
                      <span className="font-medium">Against: </span>
                      {c.against.join(' ')}
                    </p>
                  )}
                </li>
              ))}
            </ul>
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            {(['potter', 'studio'] as const).map((side) => (
              <div key={side}>
                <h3 className="text-sm font-semibold text-slip-900">
                  {side === 'potter' ? 'Next time, for the potter' : 'Next time, for the studio’s schedule'}
                </h3>
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-800">
                  {d.advice
                    .filter((a) => a.for === side)
                    .map((a) => (
                      <li key={a.text}>{a.text}</li>
                    ))}
                </ul>
              </div>
            ))}
          </div>
          <SafetyNote />
        </div>
      ) : (
        <p className="mt-2 text-sm text-slip-700">What was seen does not point at any phase of the firing.</p>
      )}
    </Card>
  )
}

function ClaimCard({ incident, claim }: { incident: IncidentJson; claim: ClaimJson }) {
  const pay = usePayClaim(incident)
  const contest = useContestClaim(incident)
  const [contesting, setContesting] = useState(false)
  const [payingKept, setPayingKept] = useState(false)
  const [reason, setReason] = useState('')
  const error = (payingKept ? null : (pay.error ?? contest.error)) as ApiError | null
  return (
    <li className="rounded-control border border-slip-200 p-4" data-testid="claim">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="font-semibold text-slip-900">
          {claim.chargeLabel}: {formatMoney(claim.amountCents, claim.currency)}
        </p>
        <Badge tone={claim.status === 'paid' ? 'celadon' : claim.status === 'waived' ? 'neutral' : 'ember'}>{claim.statusLabel}</Badge>
      </div>
      {claim.note && <p className="mt-1 text-sm text-slip-700">The studio: “{claim.note}”</p>}
      {claim.contestReason && <p className="mt-1 text-sm text-slip-700">The potter: “{claim.contestReason}”</p>}
      {claim.deskNote && <p className="mt-1 text-sm text-slip-700">The front desk: “{claim.deskNote}”</p>}
      {error && (
        <Alert tone="danger" className="mt-2">
          {error.message}
        </Alert>
      )}
      {claim.actions.length > 0 && (
        <div className="mt-3 flex flex-wrap gap-2">
          {claim.actions.includes('pay') && claim.keptCard && (
            <Button busy={pay.isPending && pay.variables?.with === 'kept-card'} onClick={() => setPayingKept(true)}>
              Pay {formatMoney(claim.amountCents, claim.currency)} with the kept card
            </Button>
          )}
          {claim.actions.includes('pay') && (
            <Button
              variant={claim.keptCard ? 'secondary' : 'primary'}
              busy={pay.isPending && pay.variables?.with === 'checkout'}
              onClick={() =>
                pay.mutate(
                  { claimId: claim.id, with: 'checkout' },
                  { onSuccess: ({ checkoutUrl }) => checkoutUrl && window.location.assign(checkoutUrl) },
                )
              }
            >
              {claim.keptCard ? 'Pay on a checkout page' : `Pay ${formatMoney(claim.amountCents, claim.currency)} by card`}
            </Button>
          )}
          {claim.actions.includes('contest') && !contesting && (
            <Button variant="secondary" onClick={() => setContesting(true)}>
              Contest
            </Button>
          )}
        </div>
      )}
      {claim.keptCard && (
        <ConfirmDialog
          open={payingKept}
          onClose={() => setPayingKept(false)}
          title={`Pay ${formatMoney(claim.amountCents, claim.currency)} now?`}
          confirmLabel={`Pay with ${claim.keptCard}`}
          busy={pay.isPending}
          problem={pay.isError ? (pay.error as ApiError).message : null}
          onConfirm={() => pay.mutate({ claimId: claim.id, with: 'kept-card' }, { onSuccess: () => setPayingKept(false) })}
        >
          {claim.keptCard}, the card you kept at the deposit, is charged {formatMoney(claim.amountCents, claim.currency)} for “
          {claim.chargeLabel.toLowerCase()}”. The studio and you get a receipt by mail.
        </ConfirmDialog>
      )}
      {contesting && (
        <form
          className="mt-3 space-y-2"
          onSubmit={(event) => {
            event.preventDefault()
            contest.mutate({ claimId: claim.id, reason }, { onSuccess: () => setContesting(false) })
          }}
        >
          <Field
            label="Why you contest it"
            hint="The front desk reads this beside the studio’s word and the firing’s log."
            error={(contest.error as ApiError | null)?.fields?.reason}
          >
            {(props) => <TextArea {...props} rows={3} value={reason} onChange={(e) => setReason(e.target.value)} />}
          </Field>
          <Button type="submit" busy={contest.isPending}>
            Send to the front desk
          </Button>
        </form>
      )}
    </li>
  )
}

function RaiseClaim({ incident }: { incident: IncidentJson }) {
  const raise = useRaiseClaim(incident)
  const [kind, setKind] = useState<DamageChargeKind>(incident.kind === 'blowout' ? 'kiln-cleaning' : 'shelf-ground')
  const [amount, setAmount] = useState('')
  const [note, setNote] = useState('')
  const cap = incident.damageCharges[kind]
  const currency = incident.claimCurrency
  const error = raise.error as ApiError | null
  return (
    <form
      className="mt-4 space-y-3 border-t border-slip-200 pt-4"
      aria-label="Claim a damage charge"
      onSubmit={(event) => {
        event.preventDefault()
        // Typed as the currency is written ("45", "45.50", "45,50"); a blank or unreadable amount is left out for the server to name.
        const shown = parseShown(amount)
        const amountCents = shown === undefined || Number.isNaN(shown) ? undefined : moneyMeasure(currency).fromShown(shown)
        raise.mutate(
          { chargeKind: kind, amountCents, note },
          {
            onSuccess: () => {
              setAmount('')
              setNote('')
            },
          },
        )
      }}
    >
      <h3 className="text-sm font-semibold text-slip-900">Claim a damage charge</h3>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field
          label="What for"
          hint={cap > 0 ? `Your terms: at most ${formatMoney(cap, currency)}.` : 'Your terms name no charge for this.'}
        >
          {(props) => (
            <Select {...props} value={kind} onChange={(e) => setKind(e.target.value as DamageChargeKind)}>
              {DAMAGE_CHARGE_KINDS.map((k) => (
                <option key={k} value={k}>
                  {DAMAGE_CHARGE_LABELS[k]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Amount" error={error?.fields?.amountCents}>
          {(props) => <TextInput {...props} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} />}
        </Field>
      </div>
      <Field label="Note for the potter" error={error?.fields?.note}>
        {(props) => <TextArea {...props} rows={2} value={note} onChange={(e) => setNote(e.target.value)} />}
      </Field>
      {error && !error.fields?.amountCents && <Alert tone="danger">{error.message}</Alert>}
      <Button type="submit" busy={raise.isPending}>
        Send the claim
      </Button>
    </form>
  )
}

/** One incident: the facts and photos, the likely phase with its evidence and advice, the damage claims, and making good to hurt potters. */
export function IncidentPage() {
  const { id = '' } = useParams()
  const [params] = useSearchParams()
  const returnedPaid = params.get('paid') === 'claim'
  const incident = useIncident(id, returnedPaid)
  if (incident.isPending) return <Spinner label="Loading the incident" />
  if (incident.isError) return <Alert tone="danger">{incident.error.message}</Alert>
  const data = incident.data
  const waitingForPayment = returnedPaid && data.claims.some((c) => c.status !== 'paid' && c.actions.includes('pay'))
  return (
    <>
      <PageHeader
        title={`What went wrong: ${data.kindLabel}`}
        lead={`${data.kilnName}, ${formatCone(data.cone)} ${data.firingKind} firing of ${formatDate(data.firingDate, data.timezone)} at ${data.studioName}`}
        actions={
          data.viewerSide === 'potter' || data.viewerSide === 'studio' ? (
            <Link to={`/requests/${data.requestId}`} className="font-medium text-clay-700 hover:underline">
              Open the ask
            </Link>
          ) : undefined
        }
      />
      <div className="space-y-5">
        {waitingForPayment && <Alert tone="info">Thank you. The payment shows here as soon as Stripe confirms it.</Alert>}
        <Facts incident={data} />
        <DiagnosisCard incident={data} />
        {data.viewerSide !== 'neighbour' && (
          <Card>
            <h2 className="text-lg font-semibold text-slip-900">Damage and who pays</h2>
            {data.claims.length ? (
              <ul className="mt-3 space-y-3">
                {data.claims.map((claim) => (
                  <ClaimCard key={claim.id} incident={data} claim={claim} />
                ))}
              </ul>
            ) : (
              <p className="mt-2 text-sm text-slip-700">No damage charge has been claimed.</p>
            )}
            {data.canClaim && <RaiseClaim incident={data} />}
          </Card>
        )}
        <MakeGood incident={data} />
      </div>
    </>
  )
}
