import { useParams } from 'react-router-dom'
import { ButtonLink } from '../../../components/ui/Button'
import { Card, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { useMe } from '../../auth/api/auth'
import { usePriceList, useSavePriceList } from '../api/kilns'
import type { KilnRecord, MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { KilnGate, KilnTitle } from '../components/KilnGate'
import { PriceListForm } from '../components/PriceListForm'
import { StudioNav } from '../components/StudioNav'
import { formatRate, formatVolume, formatTemperature, scaleOf, type UnitSystem } from '../../../lib/units'
import { kilnLimitsInWords } from '../../../lib/firingWords'

/** /kilns/:id: the kiln in plain words and its price list (the owner edits it, crew read it). */
export function KilnPage() {
  const { id = '' } = useParams()
  return <KilnGate kilnId={id}>{(kiln, studio) => <KilnOverview key={kiln.id} kiln={kiln} studio={studio} />}</KilnGate>
}

function KilnOverview({ kiln, studio }: { kiln: KilnRecord; studio: MemberStudio }) {
  const me = useMe()
  const units: UnitSystem = me.data?.unitSystem ?? 'imperial'
  const priceList = usePriceList(kiln.id)
  const save = useSavePriceList(kiln.id, studio.id)
  const isOwner = studio.myRole === 'owner'
  return (
    <>
      <PageHeader
        title={<KilnTitle kiln={kiln} />}
        lead={studio.name}
        actions={
          <ButtonLink to={`/kilns/${kiln.id}/edit`} variant="secondary">
            {isOwner ? 'Edit limits' : 'See all limits'}
          </ButtonLink>
        }
      />
      <StudioNav studioId={studio.id} role={studio.myRole} />
      <Card className="mb-6">
        <p className="font-medium" data-testid="kiln-limits">
          {kilnLimitsInWords(kiln, units)}
        </p>
        <p className="mt-1 text-sm text-slip-600">
          Tops out at {formatTemperature(kiln.maxTempC, scaleOf(units))}, climbs at most {formatRate(kiln.maxRampCPerHour, scaleOf(units))};
          holds about {formatVolume(kiln.volumeL, units)}.{kiln.preheatHold ? ' Can candle.' : ''}
          {kiln.controlledCooling ? ' Can slow cool.' : ''}
        </p>
      </Card>
      <section aria-labelledby="prices-heading">
        <h2 id="prices-heading" className="mb-3 text-xl font-bold tracking-tight">
          Prices
        </h2>
        {priceList.isPending ? (
          <Spinner label="Loading the prices…" />
        ) : priceList.isError ? (
          <ApiProblem error={priceList.error} what="the price list" onRetry={() => priceList.refetch()} />
        ) : (
          <PriceListForm
            kiln={kiln}
            priceList={priceList.data?.priceList ?? null}
            currency={studio.currency}
            units={units}
            readOnly={!isOwner}
            onSave={(body) => save.mutateAsync(body)}
          />
        )}
      </section>
    </>
  )
}
