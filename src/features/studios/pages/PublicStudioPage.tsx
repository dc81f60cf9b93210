import { lazy, Suspense, useState } from 'react'
import { useParams } from 'react-router-dom'
import { formatDateTime, formatMoney } from '../../../../shared/dates'
import { takesRequests } from '../../../../shared/workflow/firing-status'
import { MapPlaceholder } from '../../../components/map/MapPlaceholder'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { ButtonLink } from '../../../components/ui/Button'
import { Card, EmptyState } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { useMe } from '../../auth/api/auth'
import { useStudioFirings } from '../api/firings'
import { useStudioKilns } from '../api/kilns'
import { useStudio } from '../api/studios'
import { isMemberView, type FiringRecord, type KilnWithPrices, type Studio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { FiringRows } from '../components/FiringRows'
import { StudioNav } from '../components/StudioNav'
import { FireAgainSummary, StudioReviews } from '../components/StudioReviews'
import type { UnitSystem } from '../../../lib/units'
import { damageChargesInWords, kilnLimitsInWords, policiesInWords } from '../../../lib/firingWords'
import { zoneAbbreviation } from '../zonedTime'

// Leaflet and the basemap come after the studio's own details.
const PlaceMap = lazy(() => import('../../../components/map/PlaceMap').then((m) => ({ default: m.PlaceMap })))

/** /studios/:id: what a potter needs to choose this studio: kilns, coming firings, terms, prices, place. */
export function PublicStudioPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" onRetry={() => studio.refetch()} />
  return <StudioProfile key={studio.data.id} studio={studio.data} />
}

function StudioProfile({ studio }: { studio: Studio }) {
  const me = useMe()
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  const [from] = useState(() => new Date().toISOString())
  const kilns = useStudioKilns(studio.id)
  const firings = useStudioFirings(studio.id, { from })
  const zone = studio.timezone
  const member = isMemberView(studio) ? studio : null
  const kilnName = (kilnId: string) => kilns.data?.find((k) => k.id === kilnId)?.name ?? 'Kiln'
  const place = [studio.city, studio.region].filter(Boolean).join(', ')
  const calendarPath = `/api/studios/${studio.id}/calendar.ics`
  const subscribeUrl = `webcal://${window.location.host}${calendarPath}`
  // Visitors and potters ask for space (visitors sign in first); the studio's own people do not.
  const mayRequest = !member && (!me.data || me.data.role === 'potter')
  const requestLink = (firing: FiringRecord) =>
    mayRequest && takesRequests(firing.status) && new Date(firing.dropOffBy).getTime() > Date.now() ? (
      <ButtonLink
        to={`/firings/${firing.id}/request`}
        size="sm"
        aria-label={`Ask for space in the firing on ${formatDateTime(firing.firingDate, zone)}`}
      >
        Ask for space
      </ButtonLink>
    ) : null

  return (
    <article className="space-y-8">
      {member && <StudioNav studioId={studio.id} role={member.myRole} />}
      {member && !studio.published && (
        <Alert tone="warning" title="Draft: only your studio sees this page">
          {member.myRole === 'owner'
            ? 'Publish the studio in its settings when it is ready for potters.'
            : 'The owner publishes it when it is ready.'}
        </Alert>
      )}
      <header>
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-3xl font-bold tracking-tight">{studio.name}</h1>
          {studio.verified && (
            <span data-testid="verified-badge">
              <Badge tone="celadon">✓ Verified studio</Badge>
            </span>
          )}
        </div>
        <p className="mt-1 text-slip-600">{place || studio.country}</p>
        <div className="mt-2">
          <FireAgainSummary studioId={studio.id} />
        </div>
        {studio.description && <p className="mt-4 max-w-3xl whitespace-pre-line text-slip-800">{studio.description}</p>}
      </header>

      <div className="grid grid-cols-1 gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <section aria-labelledby="firings-heading" className="space-y-3">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="firings-heading" className="text-xl font-bold tracking-tight">
              Coming firings
            </h2>
            <p className="text-sm text-slip-600">
              Times in the studio’s zone: {zone.replace(/_/g, ' ')} ({zoneAbbreviation(zone)})
            </p>
          </div>
          {firings.isPending ? (
            <Spinner label="Loading firings…" />
          ) : firings.isError ? (
            <ApiProblem error={firings.error} what="the firings" onRetry={() => firings.refetch()} />
          ) : firings.data.length === 0 ? (
            <EmptyState title="No firings posted yet">Subscribe to the calendar to hear when the next one is posted.</EmptyState>
          ) : (
            <FiringRows firings={firings.data} kilnName={kilnName} zone={zone} extra={requestLink} />
          )}
        </section>

        <aside className="space-y-4">
          <Suspense fallback={<MapPlaceholder className="h-64 rounded-card border border-slip-200" label={`Where ${studio.name} is`} />}>
            <PlaceMap
              position={[studio.lat, studio.lng]}
              title={studio.name}
              zoom={12}
              className="h-64 rounded-card border border-slip-200"
              label={`Where ${studio.name} is`}
            />
          </Suspense>
          <Card as="div">
            <h2 className="font-semibold">Drop-off</h2>
            <p className="mt-1 text-sm text-slip-700">{studio.dropOffHours || 'Hours are given once the studio takes your ware on.'}</p>
            <p className="mt-2 text-xs text-slip-500">The street address is shared once the studio takes your ware on.</p>
          </Card>
          <Card as="div">
            <h2 className="font-semibold">Firing calendar</h2>
            <p className="mt-1 text-sm text-slip-600">New firings appear in your calendar app.</p>
            <div className="mt-3 flex flex-wrap gap-3 text-sm">
              <a href={subscribeUrl} className="font-semibold text-clay-700 hover:underline" data-testid="calendar-subscribe">
                Subscribe
              </a>
              <a
                href={calendarPath}
                download={`${studio.name}.ics`}
                className="font-semibold text-clay-700 hover:underline"
                data-testid="calendar-download"
              >
                Download .ics
              </a>
            </div>
          </Card>
        </aside>
      </div>

      <section aria-labelledby="kilns-heading" className="space-y-3">
        <h2 id="kilns-heading" className="text-xl font-bold tracking-tight">
          Kilns
        </h2>
        {kilns.isPending ? (
          <Spinner label="Loading kilns…" />
        ) : kilns.isError ? (
          <ApiProblem error={kilns.error} what="the kilns" />
        ) : kilns.data.length === 0 ? (
          <EmptyState title="No kilns added yet" />
        ) : (
          <>
            <ul className="grid gap-3 md:grid-cols-2">
              {kilns.data
                .filter((k) => !k.retired)
                .map((kiln) => (
                  <Card as="li" key={kiln.id}>
                    <h3 className="font-semibold">{kiln.name}</h3>
                    <p className="mt-1 text-sm text-slip-700" data-testid="kiln-limits">
                      {kilnLimitsInWords(kiln, units)}
                    </p>
                    {kiln.notes && <p className="mt-2 text-sm text-slip-600">{kiln.notes}</p>}
                  </Card>
                ))}
            </ul>
            <ExamplePrices kilns={kilns.data.filter((k) => !k.retired)} />
          </>
        )}
      </section>

      <StudioReviews studioId={studio.id} zone={zone} />

      <section aria-labelledby="policies-heading" className="space-y-3">
        <h2 id="policies-heading" className="text-xl font-bold tracking-tight">
          The studio’s terms
        </h2>
        <Card>
          <ul className="list-disc space-y-1 pl-5 text-sm text-slip-800" data-testid="policies">
            {policiesInWords(studio.policies).map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
          {studio.policies.wareRequirements && (
            <>
              <h3 className="mt-4 text-sm font-semibold">What ware must be like</h3>
              <p className="mt-1 whitespace-pre-line text-sm text-slip-700">{studio.policies.wareRequirements}</p>
            </>
          )}
          <h3 className="mt-4 text-sm font-semibold">If your ware damages the kiln or other ware</h3>
          <p className="mt-1 text-sm text-slip-700">The most the studio may charge you, with the incident as evidence:</p>
          <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-slip-800" data-testid="damage-charges">
            {damageChargesInWords(studio.policies, studio.currency).map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </Card>
      </section>
    </article>
  )
}

/** The same reference pieces priced in every kiln, so studios and pricing models compare at a glance. */
function ExamplePrices({ kilns }: { kilns: KilnWithPrices[] }) {
  const priced = kilns.filter((k) => k.examplePrices.length > 0)
  if (priced.length === 0) return <p className="text-sm text-slip-600">No price list yet: ask the studio.</p>
  const pieces = priced[0].examplePrices.map((e) => e.label)
  return (
    <div className="space-y-2">
      <h3 className="font-semibold">Example prices</h3>
      <p className="text-sm text-slip-600">Reference pieces in a cone 6 glaze firing; your own ware is priced the same way.</p>
      <Table caption="Example prices per kiln">
        <thead>
          <tr>
            <Th>Piece</Th>
            {priced.map((kiln) => (
              <Th key={kiln.id}>{kiln.name}</Th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-slip-100">
          {pieces.map((label) => (
            <tr key={label}>
              <Td className="font-medium">{label}</Td>
              {priced.map((kiln) => {
                const example = kiln.examplePrices.find((e) => e.label === label)
                return (
                  <Td key={kiln.id} data-testid="example-price">
                    {example ? (
                      <>
                        {formatMoney(example.quote.totalCents, example.quote.currency)}
                        <span className="block text-xs text-slip-500">
                          deposit {formatMoney(example.quote.depositCents, example.quote.currency)}
                        </span>
                      </>
                    ) : (
                      '—'
                    )}
                  </Td>
                )
              })}
            </tr>
          ))}
        </tbody>
      </Table>
    </div>
  )
}
