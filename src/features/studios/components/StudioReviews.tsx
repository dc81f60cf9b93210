import { formatDate } from '../../../../shared/dates'
import { STUDIO_QUESTIONS } from '../../../../shared/reviews'
import { AnswerList, tallyInWords } from '../../../components/reviews/Answers'
import { Card, EmptyState } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { useStudioPhotos, useStudioReviews, type StudioReviewsPage } from '../api/reviews'
import { ApiProblem } from './ApiProblem'

const potters = (n: number) => `${n} ${n === 1 ? 'potter' : 'potters'}`

/** For the studio's header: how many potters would fire here again, of those whose answers are published. */
export function FireAgainSummary({ studioId }: { studioId: string }) {
  const reviews = useStudioReviews(studioId)
  if (!reviews.data) return null
  const { count, fireAgain } = reviews.data.summary
  if (count === 0)
    return (
      <p className="text-sm text-slip-600" data-testid="review-summary" data-count={0}>
        No answers from potters yet
      </p>
    )
  return (
    <a
      href="#reviews-heading"
      className="inline-flex items-center gap-2 text-sm text-slip-800 hover:underline"
      data-testid="review-summary"
      data-count={count}
      data-fire-again={fireAgain}
    >
      <strong className="font-semibold">
        {fireAgain} of {potters(count)}
      </strong>{' '}
      would fire here again
    </a>
  )
}

function ReviewCard({ review, zone }: { review: StudioReviewsPage['reviews'][number]; zone: string }) {
  return (
    <Card as="li" className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2" data-testid="studio-review">
        <p className="text-sm">
          <span className="font-semibold">{review.author}</span>{' '}
          <span className="text-slip-700">{review.fireAgain ? 'would fire here again' : 'would not fire here again'}</span>
        </p>
        <time dateTime={review.at} className="text-xs text-slip-600">
          {formatDate(review.at, zone)}
        </time>
      </div>
      <AnswerList rows={STUDIO_QUESTIONS.map((q) => ({ label: q.short, answer: review[q.key] }))} />
      {review.note && (
        <p className="whitespace-pre-line text-sm text-slip-800" data-testid="review-note">
          {review.note}
        </p>
      )}
    </Card>
  )
}

/**
 * What potters answered after picking their ware up, published answers only, newest first: how often
 * each question was answered yes, partly or no, then each potter's answers.
 */
export function StudioReviews({ studioId, zone }: { studioId: string; zone: string }) {
  const reviews = useStudioReviews(studioId)
  const photos = useStudioPhotos(studioId)
  return (
    <section aria-labelledby="reviews-heading" className="space-y-3" data-testid="studio-reviews">
      <h2 id="reviews-heading" className="scroll-mt-4 text-xl font-bold tracking-tight">
        After pickup, potters said
      </h2>
      {reviews.isPending ? (
        <Spinner label="Loading the answers…" />
      ) : reviews.isError ? (
        <ApiProblem error={reviews.error} what="the answers" onRetry={() => reviews.refetch()} />
      ) : reviews.data.reviews.length === 0 ? (
        <EmptyState title="No answers yet">
          Potters answer a few questions after picking their ware up; the answers show here once the studio has answered too, or three weeks
          on.
        </EmptyState>
      ) : (
        <>
          <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2" data-testid="review-tallies">
            {STUDIO_QUESTIONS.map((q) => (
              <div key={q.key} className="flex justify-between gap-3 border-b border-slip-100 py-1">
                <dt className="text-slip-700">{q.short}</dt>
                <dd className="tabular-nums text-slip-900">{tallyInWords(reviews.data.summary.questions[q.key])}</dd>
              </div>
            ))}
          </dl>
          <ul className="grid gap-3 md:grid-cols-2">
            {reviews.data.reviews.map((review, index) => (
              <ReviewCard key={`${review.at}-${index}`} review={review} zone={zone} />
            ))}
          </ul>
        </>
      )}
      {photos.data && photos.data.photos.length > 0 && (
        <div>
          <h3 className="mb-2 text-sm font-semibold text-slip-700">From the kiln, shown by the potters</h3>
          <ul className="grid grid-cols-3 gap-2 sm:grid-cols-6" data-testid="studio-result-photos">
            {photos.data.photos.map((photo) => (
              <li key={photo.id}>
                <a
                  href={photo.url}
                  target="_blank"
                  rel="noreferrer"
                  className="block overflow-hidden rounded-control border border-slip-200"
                >
                  <img
                    src={photo.thumbUrl}
                    alt="A fired piece from this studio"
                    loading="lazy"
                    className="aspect-square w-full object-cover"
                  />
                </a>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  )
}
