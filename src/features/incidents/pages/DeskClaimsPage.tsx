import { useState } from 'react'
import { Link } from 'react-router-dom'
import type { ClaimJson } from '../../../../shared/api/incidents'
import { formatMoney } from '../../../../shared/dates'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Field, TextArea } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import type { ApiError } from '../../../lib/api'
import { useDecideClaim, useDeskClaims } from '../api/incidents'

function ContestedClaim({ claim }: { claim: ClaimJson }) {
  const decide = useDecideClaim()
  const [note, setNote] = useState('')
  return (
    <Card as="li">
      <h2 className="font-semibold text-slip-900">
        {claim.studioName} claims {formatMoney(claim.amountCents, claim.currency)} from {claim.potterName}
      </h2>
      <p className="mt-1 text-sm text-slip-700">{claim.chargeLabel}</p>
      <dl className="mt-3 space-y-2 text-sm">
        <div>
          <dt className="font-medium text-slip-600">The studio’s word</dt>
          <dd className="text-slip-900">{claim.note || 'No note.'}</dd>
        </div>
        <div>
          <dt className="font-medium text-slip-600">The potter’s word</dt>
          <dd className="text-slip-900">{claim.contestReason}</dd>
        </div>
      </dl>
      <p className="mt-2 text-sm">
        <Link to={`/incidents/${claim.incidentId}`} className="font-medium text-clay-700 hover:underline">
          The incident, its photos, the firing’s log and the likely phase
        </Link>
      </p>
      <div className="mt-3 space-y-2">
        <Field label="The desk’s note to both sides">
          {(props) => <TextArea {...props} rows={2} value={note} onChange={(e) => setNote(e.target.value)} />}
        </Field>
        {decide.error && <Alert tone="danger">{(decide.error as ApiError).message}</Alert>}
        <div className="flex flex-wrap gap-2">
          <Button busy={decide.isPending} onClick={() => decide.mutate({ claimId: claim.id, body: { decision: 'uphold', note } })}>
            Uphold: the potter pays
          </Button>
          <Button
            variant="secondary"
            busy={decide.isPending}
            onClick={() => decide.mutate({ claimId: claim.id, body: { decision: 'waive', note } })}
          >
            Waive it
          </Button>
        </div>
      </div>
    </Card>
  )
}

/** The front desk's contested damage claims, each with both sides' words and the incident behind it. */
export function DeskClaimsPage() {
  const claims = useDeskClaims()
  return (
    <>
      <PageHeader
        title="Contested damage claims"
        lead="Read both sides and the incident, then uphold the claim (the potter is asked to pay) or waive it."
      />
      {claims.isPending ? (
        <Spinner label="Loading the claims" />
      ) : claims.isError ? (
        <Alert tone="danger">{claims.error.message}</Alert>
      ) : claims.data.claims.length === 0 ? (
        <EmptyState title="No contested claims">Claims a potter contests come here.</EmptyState>
      ) : (
        <ul className="space-y-4">
          {claims.data.claims.map((claim) => (
            <ContestedClaim key={claim.id} claim={claim} />
          ))}
        </ul>
      )}
    </>
  )
}
