import { formatDate } from '../../../../shared/dates'
import { StarsShown } from '../../../components/ratings/Stars'
import { Card, EmptyState } from '../../../components/ui/Card'
import { Spinner } from '../../../components/ui/Spinner'
import { useStudioPhotos, useStudioRatings, type PublicRating } from '../api/ratings'
import { ApiProblem } from './ApiProblem'

const count = (n: number) => `${n} ${n === 1 ? 'rating' : 'ratings'}`

/** The mean of potters' ratings with how many there are, for the studio's header. */
export function RatingSummary({ studioId }: { studioId: string }) {
  const ratings = useStudioRatings(studioId)
  if (!ratings.data) return null
  const { mean, count: n } = ratings.data.summary
  if (mean === null || n === 0)
    return (
      <p className="text-sm text-slip-500" data-testid="rating-summary" data-count={0}>
        No ratings yet
      </p>
    )
  return (
    <a
      href="#ratings-heading"
      className="inline-flex items-center gap-2 text-sm text-slip-800 hover:underline"
      data-testid="rating-summary"
      data-count={n}
      data-mean={mean}
    >
      <StarsShown value={mean} />
      <span>
        <strong className="font-semibold">{mean.toFixed(1)}</strong> · {count(n)}
      </span>
    </a>
  )
}

const ASPECTS = [
  { key: 'care', label: 'Care of the ware' },
  { key: 'communication', label: 'Communication' },
  { key: 'results', label: 'Results' },
] as const

function RatingCard({ rating, zone }: { rating: PublicRating; zone: string }) {
  const aspects = ASPECTS.filter((a) => rating[a.key] !== null)
  return (
    <Card as="li" className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="flex items-center gap-2">
          <StarsShown value={rating.stars} />
          <span className="text-sm font-semibold">{rating.author}</span>
        </p>
        <time dateTime={rating.at} className="text-xs text-slip-500">
          {formatDate(rating.at, zone)}
        </time>
      </div>
      {aspects.length > 0 && (
        <p className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-slip-600">
          {aspects.map((a) => (
            <span key={a.key}>
              {a.label} {rating[a.key]}/5
            </span>
          ))}
        </p>
      )}
      {rating.text && (
        <p className="whitespace-pre-line text-sm text-slip-800" data-testid="rating-text">
          {rating.text}
        </p>
      )}
      {rating.reply && (
        <div className="border-l-4 border-clay-200 pl-3">
          <p className="text-xs font-semibold text-slip-600">The studio’s reply</p>
          <p className="whitespace-pre-line text-sm text-slip-800">{rating.reply}</p>
        </div>
      )}
    </Card>
  )
}

/** What potters said after collecting their ware, newest first, with the studio's replies. */
export function StudioRatings({ studioId, zone }: { studioId: string; zone: string }) {
  const ratings = useStudioRatings(studioId)
  const photos = useStudioPhotos(studioId)
  return (
    <section aria-labelledby="ratings-heading" className="space-y-3" data-testid="studio-ratings">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="ratings-heading" className="scroll-mt-4 text-xl font-bold tracking-tight">
          What potters say
        </h2>
        {ratings.data && ratings.data.summary.mean !== null && (
          <p className="text-sm text-slip-600">
            Mean {ratings.data.summary.mean.toFixed(1)} of 5 from {count(ratings.data.summary.count)}
          </p>
        )}
      </div>
      {ratings.isPending ? (
        <Spinner label="Loading ratings…" />
      ) : ratings.isError ? (
        <ApiProblem error={ratings.error} what="the ratings" onRetry={() => ratings.refetch()} />
      ) : ratings.data.ratings.length === 0 ? (
        <EmptyState title="No ratings yet">Potters rate a studio after collecting their ware.</EmptyState>
      ) : (
        <ul className="grid gap-3 md:grid-cols-2">
          {ratings.data.ratings.map((rating, index) => (
            <RatingCard key={`${rating.at}-${index}`} rating={rating} zone={zone} />
          ))}
        </ul>
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
