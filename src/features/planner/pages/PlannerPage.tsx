import { lazy, Suspense, useState } from 'react'
import { useForm } from 'react-hook-form'
import { checkWare, type WareCheck } from '../../../../shared/firing/check'
import { quoteRequest, type Quote } from '../../../../shared/firing/quote'
import { SafetyNote } from '../../../components/SafetyNote'
import { Alert } from '../../../components/ui/Alert'
import { Card, PageHeader } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { CheckCard, VerdictBar } from '../../../components/ware/CheckCard'
import { ConeSuggestions } from '../../../components/ware/ConeField'
import { PieceRows } from '../../../components/ware/PieceRows'
import { QuoteSummary } from '../../../components/ware/QuoteSummary'
import { scaleOf, type TemperatureScale, type UnitSystem } from '../../../lib/units'
import { useMe } from '../../auth/api/auth'
import { useServerWareCheck, type WareCheckRequest } from '../api/wareChecks'
import { ChoiceSwitch } from '../../../components/ui/ChoiceSwitch'
import { FiringFields } from '../components/FiringFields'
import { FitSummary } from '../components/FitSummary'
import { KilnFields } from '../components/KilnFields'
import { PriceListFields } from '../components/PriceListFields'
import { ServerCheck } from '../components/ServerCheck'
import { demoKiln } from '../demoKilns'
import { kilnDraftOf, parsePlanner, plannerDefaults, type CheckInput, type PlannerValues } from '../plannerForm'

const UNIT_CHOICES = [
  { value: 'imperial', label: 'in · °F' },
  { value: 'metric', label: 'mm · °C' },
] as const

const CHECK_ID = 'planner-check'

interface Outcome {
  check: WareCheck
  quote: Quote | null
  quoteProblem: string | null
}

// The inputs have passed the shared schemas, so this should not throw; if the science still refuses
// something, the page says so instead of going blank.
function runCheck(input: CheckInput, priceList: WareCheckRequest['priceList'] | null): Outcome | string {
  try {
    const check = checkWare(input.kiln, input.firing, input.pieces)
    if (!priceList) return { check, quote: null, quoteProblem: null }
    try {
      return { check, quote: quoteRequest(priceList, input.firing, input.pieces, input.kiln), quoteProblem: null }
    } catch (error) {
      return { check, quote: null, quoteProblem: error instanceof Error ? error.message : String(error) }
    }
  } catch (error) {
    return error instanceof Error ? error.message : String(error)
  }
}

// The chart library is the planner's heaviest part and is only drawn once a check has a schedule.
const FiringCurveChart = lazy(() => import('../components/FiringCurveChart').then((m) => ({ default: m.FiringCurveChart })))

export function PlannerPage() {
  const me = useMe()
  const [chosenUnits, setChosenUnits] = useState<UnitSystem | null>(null)
  const [chosenScale, setChosenScale] = useState<TemperatureScale | null>(null)
  const units: UnitSystem = chosenUnits ?? me.data?.unitSystem ?? 'imperial'
  const scale = chosenScale ?? scaleOf(units)

  const { control, register, watch, setValue } = useForm<PlannerValues>({ defaultValues: plannerDefaults() })
  const values = watch()
  const parsed = parsePlanner(values, units)
  const outcome = parsed.input ? runCheck(parsed.input, parsed.priceList) : null
  const result = outcome !== null && typeof outcome !== 'string' ? outcome : null

  const request: WareCheckRequest | null = parsed.input
    ? { ...parsed.input, ...(parsed.priceList ? { priceList: parsed.priceList } : {}) }
    : null
  const server = useServerWareCheck(result ? request : null)

  const pickDemo = (id: string) => {
    const demo = demoKiln(id)
    if (demo) setValue('kiln', kilnDraftOf(demo.kiln))
  }
  const sections = { control, register, messages: parsed.messages, units }

  return (
    <>
      <PageHeader
        title="Firing planner"
        lead="Describe a kiln, a firing and your pieces: see at once whether they go together, the firing curve, how long it takes and what it costs."
        actions={
          <ChoiceSwitch
            legend="Units"
            value={units}
            choices={UNIT_CHOICES}
            onChange={(next) => {
              setChosenUnits(next)
              setChosenScale(null)
            }}
          />
        }
      />
      <ConeSuggestions />
      <div className="grid gap-6 pb-16 lg:grid-cols-2 lg:items-start lg:pb-0">
        <form className="min-w-0 space-y-6" noValidate onSubmit={(event) => event.preventDefault()} aria-label="Kiln, firing and pieces">
          <KilnFields {...sections} onPickDemo={pickDemo} />
          <FiringFields {...sections} />
          <PieceRows {...sections} />
          <PriceListFields {...sections} />
        </form>

        <div className="min-w-0 space-y-6">
          <CheckCard
            id={CHECK_ID}
            check={result?.check ?? null}
            problem={typeof outcome === 'string' ? outcome : null}
            pieces={parsed.input?.pieces ?? []}
          >
            {result && <ServerCheck server={server} local={result.check} />}
          </CheckCard>

          {result && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold text-slip-900">Fit and timing</h2>
              <FitSummary check={result.check} kiln={parsed.input!.kiln} units={units} scale={scale} />
              <div className="mt-5">
                <Suspense fallback={<Spinner label="Drawing the firing curve…" />}>
                  <FiringCurveChart schedule={result.check.schedule} scale={scale} onScaleChange={setChosenScale} />
                </Suspense>
              </div>
            </Card>
          )}

          {values.quoteOn && (
            <Card>
              <h2 className="mb-3 text-lg font-semibold text-slip-900">Quote</h2>
              {result?.quote ? (
                <QuoteSummary quote={result.quote} />
              ) : result?.quoteProblem ? (
                <Alert tone="warning">{result.quoteProblem}</Alert>
              ) : (
                <p className="text-sm text-slip-600">Fill in the price list and the pieces to see the quote.</p>
              )}
              <p className="mt-3 text-xs text-slip-500">
                Worked out from the rates above; a studio’s own price list is the one that counts.
              </p>
            </Card>
          )}

          <SafetyNote />
        </div>
      </div>

      <VerdictBar verdict={result?.check.verdict ?? null} checkId={CHECK_ID} />
    </>
  )
}
