import { useState } from 'react'
import { formatDate } from '../../../../shared/dates'
import {
  ANSWER_WORDS,
  ANSWERS,
  FIRE_AGAIN_QUESTION,
  questionsOf,
  REVIEW_WINDOW_DAYS,
  unanswered,
  type Answer,
  type ReviewSide,
} from '../../../../shared/reviews'
import { reviewSchema } from '../../../../shared/schemas/pickup'
import { AnswerChoice, AnswerList } from '../../../components/reviews/Answers'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextArea } from '../../../components/ui/Field'
import { ApiError } from '../../../lib/api'
import { useGiveReview, type ReviewBody } from '../api/pickup'
import type { RequestView, ReviewRecord } from '../api/types'

const problemOf = (error: unknown) => (error instanceof ApiError ? error.message : 'Something went wrong. Please try again.')

const ANSWER_CHOICES = ANSWERS.map((value) => ({ value, label: ANSWER_WORDS[value] }))
const FIRE_AGAIN_CHOICES = [
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
] as const

/** One side's answers, question by question, with the potter's word on firing there again. */
function AnswersShown({ review, side }: { review: ReviewRecord; side: ReviewSide }) {
  return (
    <div className="space-y-2">
      {side === 'potter' && review.fireAgain !== null && (
        <p className="text-sm font-semibold" data-testid="fire-again" data-value={review.fireAgain ? 'yes' : 'no'}>
          {review.fireAgain ? 'Would fire here again' : 'Would not fire here again'}
        </p>
      )}
      <AnswerList rows={questionsOf(side).map((q) => ({ label: q.short, answer: review[q.key] }))} />
      {review.note && <p className="whitespace-pre-line text-sm text-slip-800">“{review.note}”</p>}
    </div>
  )
}

/** This side's answers, given once: every question, then a note in their own words. */
function ReviewForm({ view, side }: { view: RequestView; side: ReviewSide }) {
  const give = useGiveReview()
  const [answers, setAnswers] = useState<Partial<Record<string, Answer>>>({})
  const [fireAgain, setFireAgain] = useState<boolean | undefined>(undefined)
  const [note, setNote] = useState('')
  const [touched, setTouched] = useState(false)
  const body: ReviewBody = { ...answers, ...(side === 'potter' && fireAgain !== undefined ? { fireAgain } : {}), note }
  const parsed = reviewSchema.safeParse(body)
  const missing = unanswered(side, body)
  const messageFor = (key: string) =>
    touched ? (missing[key] ?? (parsed.success ? undefined : parsed.error.issues.find((i) => i.path[0] === key)?.message)) : undefined
  const other = side === 'potter' ? view.studio.name : view.potter.displayName
  return (
    <form
      className="space-y-4"
      noValidate
      aria-label={`Your answers about ${other}`}
      data-testid="review-form"
      onSubmit={(event) => {
        event.preventDefault()
        setTouched(true)
        if (parsed.success && Object.keys(missing).length === 0) give.mutate({ view, body: parsed.data })
      }}
    >
      {side === 'potter' && (
        <AnswerChoice
          legend={FIRE_AGAIN_QUESTION}
          value={fireAgain === undefined ? undefined : fireAgain ? 'yes' : 'no'}
          choices={FIRE_AGAIN_CHOICES}
          onChange={(value) => setFireAgain(value === 'yes')}
          error={messageFor('fireAgain')}
        />
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        {questionsOf(side).map((q) => (
          <AnswerChoice
            key={q.key}
            legend={q.question}
            value={answers[q.key]}
            choices={ANSWER_CHOICES}
            onChange={(value) => setAnswers((a) => ({ ...a, [q.key]: value }))}
            error={messageFor(q.key)}
          />
        ))}
      </div>
      <Field
        label="Anything to add (optional)"
        hint={
          side === 'potter'
            ? 'Shown on the studio’s public page with your first name, once the answers are published.'
            : 'Studios deciding on this potter’s next ask see it, once the answers are published.'
        }
        error={messageFor('note')}
      >
        {(a11y) => <TextArea {...a11y} rows={3} value={note} maxLength={2000} onChange={(event) => setNote(event.target.value)} />}
      </Field>
      {give.isError && <Alert tone="danger">{problemOf(give.error)}</Alert>}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={give.isPending}>
          Send my answers
        </Button>
        <p className="text-xs text-slip-600">Answers are final once sent.</p>
      </div>
    </form>
  )
}

/**
 * The answers after pickup on one request: this side's, given once, and the other side's once
 * published. Neither side sees the other's before both have answered or the window closes, so neither
 * answers the other.
 */
export function ReviewsPanel({ view }: { view: RequestView }) {
  const side: ReviewSide = view.viewer === 'potter' ? 'potter' : 'studio'
  const otherSide: ReviewSide = side === 'potter' ? 'studio' : 'potter'
  const mine = side === 'potter' ? view.reviews.ofStudio : view.reviews.ofPotter
  const theirs = side === 'potter' ? view.reviews.ofPotter : view.reviews.ofStudio
  const zone = view.studio.timezone
  const closesAt = view.reviews.closesAt
  const closed = closesAt !== null && new Date(closesAt).getTime() <= Date.now()
  const canAnswer = view.actions.includes('rate')
  const other = side === 'potter' ? view.studio.name : view.potter.displayName

  return (
    <div className="space-y-6" data-testid="reviews">
      <p className="text-sm text-slip-600">
        {side === 'potter'
          ? `A few questions about the firing and whether you would fire with ${view.studio.name} again.`
          : `A few questions about ${view.potter.displayName}’s ware and timing, for other studios to read.`}{' '}
        Neither side sees the other’s answers until both have answered
        {closesAt ? `, or until ${formatDate(closesAt, zone)}` : `, or for ${REVIEW_WINDOW_DAYS} days after pickup`}.
      </p>
      <section aria-labelledby="my-review" className="space-y-3" data-testid="my-review" data-given={mine ? 'true' : 'false'}>
        <h3 id="my-review" className="font-semibold">
          Your answers about {other}
        </h3>
        {mine ? (
          <>
            <AnswersShown review={mine} side={side} />
            <p className="text-xs text-slip-600" data-testid="my-review-status">
              Sent {formatDate(mine.at, zone)}.{' '}
              {mine.publishedAt
                ? `Published ${formatDate(mine.publishedAt, zone)}.`
                : `Kept from ${other} until they answer too${closesAt ? `, or until ${formatDate(closesAt, zone)}` : ''}.`}
            </p>
          </>
        ) : canAnswer ? (
          <ReviewForm view={view} side={side} />
        ) : (
          <p className="text-sm text-slip-600">
            {closed ? `The window for answers closed on ${formatDate(closesAt!, zone)}.` : 'Answers open once the ware has been picked up.'}
          </p>
        )}
      </section>

      <section aria-labelledby="their-review" className="space-y-3" data-testid="their-review">
        <h3 id="their-review" className="font-semibold">
          {other}’s answers about {side === 'potter' ? 'you' : 'your studio'}
        </h3>
        {theirs ? (
          <AnswersShown review={theirs} side={otherSide} />
        ) : view.reviews.answered[otherSide] ? (
          <p className="text-sm text-slip-600" data-testid="their-review-hidden">
            Given, and kept from you until you give yours{closesAt ? ` or until ${formatDate(closesAt, zone)}` : ''}.
          </p>
        ) : (
          <p className="text-sm text-slip-600">Not given yet.</p>
        )}
      </section>
    </div>
  )
}
