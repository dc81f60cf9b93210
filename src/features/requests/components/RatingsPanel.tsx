import { useState } from 'react'
import { formatDate } from '../../../../shared/dates'
import { ratingReplySchema, ratingSchema } from '../../../../shared/schemas/pickup'
import { StarInput, StarsShown } from '../../../components/ratings/Stars'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextArea } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { useRate, useReplyToRating, type RatingBody } from '../api/pickup'
import type { RatingRecord, RequestView } from '../api/types'

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

type Aspect = 'care' | 'communication' | 'results' | 'asDeclared' | 'onTime'

const ASPECTS: Record<'potter' | 'studio', { key: Aspect; label: string }[]> = {
  // The potter rates the studio; the studio rates the potter.
  potter: [
    { key: 'care', label: 'Care of the ware' },
    { key: 'communication', label: 'Communication' },
    { key: 'results', label: 'Results' },
  ],
  studio: [
    { key: 'asDeclared', label: 'Ware as declared' },
    { key: 'onTime', label: 'On time' },
  ],
}

function RatingShown({ rating, side }: { rating: RatingRecord; side: 'potter' | 'studio' }) {
  const aspects = ASPECTS[side].filter((a) => rating[a.key] !== null)
  return (
    <div className="space-y-2">
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <StarsShown value={rating.stars} /> <span className="font-semibold">{rating.stars} of 5 overall</span>
      </p>
      {aspects.length > 0 && (
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          {aspects.map((a) => (
            <div key={a.key} className="contents">
              <dt className="text-slip-600">{a.label}</dt>
              <dd>
                <StarsShown value={rating[a.key] as number} />
              </dd>
            </div>
          ))}
        </dl>
      )}
      {rating.text && <p className="whitespace-pre-line text-sm text-slip-800">“{rating.text}”</p>}
    </div>
  )
}

/** Give or change this side's rating: overall and per aspect, 1 to 5, with words. */
function RatingForm({
  view,
  side,
  given,
  onDone,
}: {
  view: RequestView
  side: 'potter' | 'studio'
  given: RatingRecord | null
  onDone: () => void
}) {
  const rate = useRate()
  const [values, setValues] = useState<Partial<Record<Aspect | 'stars', number>>>(() => {
    if (!given) return {}
    const start: Partial<Record<Aspect | 'stars', number>> = { stars: given.stars }
    for (const a of ASPECTS[side]) if (given[a.key] !== null) start[a.key] = given[a.key] as number
    return start
  })
  const [text, setText] = useState(given?.text ?? '')
  const [touched, setTouched] = useState(false)
  const body: RatingBody = {
    stars: values.stars as number,
    text,
    ...Object.fromEntries(ASPECTS[side].filter((a) => values[a.key] !== undefined).map((a) => [a.key, values[a.key]])),
  }
  const parsed = ratingSchema.safeParse(body)
  const messageFor = (key: string) => (touched && !parsed.success ? parsed.error.issues.find((i) => i.path[0] === key)?.message : undefined)
  const other = side === 'potter' ? view.studio.name : view.potter.displayName
  return (
    <form
      className="space-y-4"
      noValidate
      aria-label={`Rate ${other}`}
      data-testid="rating-form"
      onSubmit={(event) => {
        event.preventDefault()
        setTouched(true)
        if (parsed.success) rate.mutate({ view, body: parsed.data }, { onSuccess: onDone })
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        {ASPECTS[side].map((a) => (
          <StarInput
            key={a.key}
            label={a.label}
            value={values[a.key]}
            onChange={(stars) => setValues((v) => ({ ...v, [a.key]: stars }))}
            error={messageFor(a.key)}
          />
        ))}
        <StarInput
          label="Overall"
          value={values.stars}
          onChange={(stars) => setValues((v) => ({ ...v, stars }))}
          error={messageFor('stars')}
          hint="This is the one counted in public."
        />
      </div>
      <Field
        label="In your words"
        hint={
          side === 'potter'
            ? 'Shown on the studio’s public page with your first name.'
            : 'Studios deciding on this potter’s next request see it.'
        }
        error={messageFor('text')}
      >
        {(a11y) => <TextArea {...a11y} rows={3} value={text} maxLength={2000} onChange={(event) => setText(event.target.value)} />}
      </Field>
      {rate.isError && <Alert tone="danger">{problemOf(rate.error)}</Alert>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={rate.isPending}>
          {given ? 'Save the change' : 'Send the rating'}
        </Button>
        {given && (
          <Button variant="ghost" onClick={onDone}>
            Keep it as it was
          </Button>
        )}
      </div>
    </form>
  )
}

function ReplyForm({ view }: { view: RequestView }) {
  const reply = useReplyToRating()
  const [text, setText] = useState('')
  const [touched, setTouched] = useState(false)
  const parsed = ratingReplySchema.safeParse({ text })
  return (
    <form
      className="space-y-2"
      noValidate
      aria-label="Reply to the rating"
      onSubmit={(event) => {
        event.preventDefault()
        setTouched(true)
        if (parsed.success) reply.mutate({ view, text: parsed.data.text })
      }}
    >
      <Field
        label="Your reply, shown in public"
        hint="Once only, shown under the rating on your studio’s page."
        error={touched && !parsed.success ? parsed.error.issues[0]?.message : undefined}
      >
        {(a11y) => <TextArea {...a11y} rows={2} value={text} maxLength={2000} onChange={(event) => setText(event.target.value)} />}
      </Field>
      {reply.isError && <Alert tone="danger">{problemOf(reply.error)}</Alert>}
      <Button type="submit" size="sm" variant="secondary" busy={reply.isPending}>
        Post the reply
      </Button>
    </form>
  )
}

/** Both ratings of a collected request: this side's (to give or edit while it may) and the other side's. */
export function RatingsPanel({ view }: { view: RequestView }) {
  const side: 'potter' | 'studio' = view.viewer === 'potter' ? 'potter' : 'studio'
  const mine = side === 'potter' ? view.ratings.ofStudio : view.ratings.ofPotter
  const theirs = side === 'potter' ? view.ratings.ofPotter : view.ratings.ofStudio
  const [editing, setEditing] = useState(false)
  const zone = view.studio.timezone
  const canRate = view.actions.includes('rate')
  const editable = mine !== null && canRate && new Date(mine.editableUntil).getTime() > Date.now()
  const other = side === 'potter' ? view.studio.name : view.potter.displayName
  const reply = view.ratings.ofStudio?.reply ?? null

  return (
    <div className="space-y-6" data-testid="ratings">
      <section aria-labelledby="my-rating" className="space-y-3" data-testid="my-rating" data-given={mine ? 'true' : 'false'}>
        <h3 id="my-rating" className="font-semibold">
          Your rating of {other}
        </h3>
        {mine && !editing ? (
          <>
            <RatingShown rating={mine} side={side} />
            {editable ? (
              <p className="flex flex-wrap items-center gap-3 text-xs text-slip-600">
                You can change it until {formatDate(mine.editableUntil, zone)}.
                <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
                  Change the rating
                </Button>
              </p>
            ) : (
              <p className="text-xs text-slip-500">Given {formatDate(mine.at, zone)}; it can no longer be changed.</p>
            )}
          </>
        ) : canRate ? (
          <RatingForm view={view} side={side} given={editing ? mine : null} onDone={() => setEditing(false)} />
        ) : (
          <p className="text-sm text-slip-600">Ratings open once the ware has been collected.</p>
        )}
      </section>

      <section aria-labelledby="their-rating" className="space-y-3" data-testid="their-rating">
        <h3 id="their-rating" className="font-semibold">
          {other}’s rating of {side === 'potter' ? 'you' : 'your studio'}
        </h3>
        {theirs ? (
          <RatingShown rating={theirs} side={side === 'potter' ? 'studio' : 'potter'} />
        ) : (
          <p className="text-sm text-slip-600">Not given yet.</p>
        )}
      </section>

      {(reply || (side === 'studio' && view.ratings.ofStudio)) && (
        <section aria-labelledby="studio-reply" className="space-y-2" data-testid="studio-reply">
          <h3 id="studio-reply" className="font-semibold">
            {side === 'studio' ? 'Your public reply' : `${view.studio.name}’s reply`}
          </h3>
          {reply ? (
            <p className="whitespace-pre-line border-l-4 border-clay-200 pl-3 text-sm text-slip-800">{reply}</p>
          ) : view.actions.includes('reply') ? (
            <ReplyForm view={view} />
          ) : null}
        </section>
      )}
    </div>
  )
}
