import { Navigate } from 'react-router-dom'
import { ButtonLink } from '../../../components/ui/Button'
import { Card } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { drawnAhead } from '../../../lib/prerendered'
import { useMe } from '../../auth/api/auth'
import { homePath } from '../../auth/homePath'

const STEPS = [
  { title: 'Describe the ware', text: 'Sizes, clay body, glaze, cone. The kiln’s limits are checked before you drive over.' },
  { title: 'Ask for shelf space', text: 'Pick a firing with room left, see the price up front, pay a deposit to hold the space.' },
  { title: 'Drop off, pick up', text: 'Follow the firing from drop-off to results photos, then pick up your pots.' },
]

export function LandingPage() {
  const me = useMe()
  if (me.data) return <Navigate to={homePath(me.data)} replace />
  // A visitor's landing page comes drawn in the HTML; it stays while the check runs.
  if (me.isPending && !drawnAhead()) return <Spinner />
  return (
    <div className="space-y-10">
      <section className="grid items-center gap-8 md:grid-cols-2">
        <div>
          <p className="text-sm font-semibold uppercase tracking-wide text-clay-600">Contract kiln firing</p>
          <h1 className="mt-2 text-4xl font-bold tracking-tight text-slip-900 sm:text-5xl">The right kiln for your ware, nearby.</h1>
          <p className="mt-4 text-lg text-slip-600">
            Conewright matches potters who need a cone, an atmosphere or a date their own kiln can’t reach with studios that have shelf
            space to sell — and checks the ware against the kiln first, so nobody’s load is put at risk.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            <ButtonLink to="/join">Make an account</ButtonLink>
            <ButtonLink to="/planner" variant="secondary">
              Try the firing planner
            </ButtonLink>
          </div>
        </div>
        <Card className="bg-gradient-to-br from-clay-50 to-ember-100">
          <p className="text-sm font-semibold text-clay-800">For kiln owners</p>
          <p className="mt-2 text-slip-700">
            List each kiln’s real limits and your firing calendar. Take in only ware that is bone dry, sized to your shelves and matched to
            the cone — the check runs before an ask ever reaches you.
          </p>
          <ButtonLink to="/join" variant="secondary" className="mt-4">
            List your kiln room
          </ButtonLink>
        </Card>
      </section>
      <section className="grid gap-4 sm:grid-cols-3">
        {STEPS.map((step, i) => (
          <Card key={step.title}>
            <p className="text-sm font-semibold text-clay-600">{i + 1}</p>
            <h2 className="mt-1 font-semibold">{step.title}</h2>
            <p className="mt-1 text-sm text-slip-600">{step.text}</p>
          </Card>
        ))}
      </section>
    </div>
  )
}
