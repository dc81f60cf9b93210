import { useEffect, useState, type ReactNode } from 'react'
import { Button } from '../ui/Button'
import { Dialog } from '../ui/Dialog'
import { PHOTO_KIND_WORDS, type PhotoKind, type PhotoRecord } from './photoTypes'

const KIND_ORDER: readonly PhotoKind[] = ['ware', 'check-in', 'refusal', 'result']

interface PhotoGalleryProps {
  photos: PhotoRecord[]
  /** Which kinds to show, in this order; every kind when left out. */
  kinds?: readonly PhotoKind[]
  /** Headings per kind, when the page has better words than the defaults. */
  headings?: Partial<Record<PhotoKind, string>>
  /** Something under a thumbnail (the potter's "show on the studio's page" switch). */
  below?: (photo: PhotoRecord) => ReactNode
  /** Said when there is nothing to show; nothing is drawn when left out. */
  empty?: ReactNode
  /** Heading level inside the page. */
  headingLevel?: 'h3' | 'h4'
}

/** Thumbnails grouped by what they show; each opens at full size, with the arrow keys moving between them. */
export function PhotoGallery({ photos, kinds = KIND_ORDER, headings = {}, below, empty, headingLevel: Heading = 'h3' }: PhotoGalleryProps) {
  const [open, setOpen] = useState<{ kind: PhotoKind; index: number } | null>(null)
  const groups = kinds
    .map((kind) => ({ kind, title: headings[kind] ?? PHOTO_KIND_WORDS[kind], photos: photos.filter((p) => p.kind === kind) }))
    .filter((g) => g.photos.length > 0)
  if (groups.length === 0) return empty ? <p className="text-sm text-slip-600">{empty}</p> : null
  const group = open ? groups.find((g) => g.kind === open.kind) : undefined
  const shown = group && open ? group.photos[Math.min(open.index, group.photos.length - 1)] : undefined

  return (
    <div className="space-y-4" data-testid="photo-gallery">
      {groups.map((g) => (
        <section key={g.kind} aria-label={g.title} data-kind={g.kind} className="space-y-2">
          <Heading className="text-sm font-semibold text-slip-800">
            {g.title} <span className="font-normal text-slip-500">({g.photos.length})</span>
          </Heading>
          <ul className="grid grid-cols-3 gap-2 sm:grid-cols-4 md:grid-cols-5">
            {g.photos.map((photo, index) => (
              <li key={photo.id} className="space-y-1" data-testid="gallery-photo" data-photo-id={photo.id}>
                <button
                  type="button"
                  onClick={() => setOpen({ kind: g.kind, index })}
                  disabled={photo.processing}
                  className="focus-ring block aspect-square w-full overflow-hidden rounded-control border border-slip-200 bg-slip-100 hover:border-clay-400"
                >
                  {photo.processing ? (
                    <span className="flex size-full items-center justify-center text-xs text-slip-500">
                      Preparing…<span className="sr-only"> {`${g.title}: photo ${index + 1} of ${g.photos.length}`}</span>
                    </span>
                  ) : (
                    <>
                      {/* The photo's own words name the button; the action is added for a screen reader. */}
                      <img
                        src={photo.thumbUrl}
                        alt={`${g.title}: photo ${index + 1} of ${g.photos.length}`}
                        loading="lazy"
                        className="size-full object-cover"
                      />
                      <span className="sr-only">, open at full size</span>
                    </>
                  )}
                </button>
                {below?.(photo)}
              </li>
            ))}
          </ul>
        </section>
      ))}
      {group && shown && open && (
        <Lightbox
          photo={shown}
          title={group.title}
          index={open.index}
          count={group.photos.length}
          onMove={(index) => setOpen({ kind: group.kind, index })}
          onClose={() => setOpen(null)}
        />
      )}
    </div>
  )
}

interface LightboxProps {
  photo: PhotoRecord
  title: string
  index: number
  count: number
  onMove: (index: number) => void
  onClose: () => void
}

function Lightbox({ photo, title, index, count, onMove, onClose }: LightboxProps) {
  const previous = () => onMove((index - 1 + count) % count)
  const next = () => onMove((index + 1) % count)
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'ArrowLeft') onMove((index - 1 + count) % count)
      if (event.key === 'ArrowRight') onMove((index + 1) % count)
    }
    window.addEventListener('keydown', onKey)
    return () => window.removeEventListener('keydown', onKey)
  }, [index, count, onMove])
  return (
    <Dialog
      open
      onClose={onClose}
      size="lg"
      title={`${title}: photo ${index + 1} of ${count}`}
      description={count > 1 ? 'The arrow keys move between the photos.' : undefined}
      footer={
        <>
          <a
            href={photo.url}
            target="_blank"
            rel="noreferrer"
            className="mr-auto self-center text-sm font-semibold text-clay-700 hover:underline"
          >
            Open the original
          </a>
          {count > 1 && (
            <>
              <Button variant="secondary" size="sm" onClick={previous}>
                ← Previous
              </Button>
              <Button variant="secondary" size="sm" onClick={next}>
                Next →
              </Button>
            </>
          )}
        </>
      }
    >
      <img
        src={photo.url}
        alt={`${title}, photo ${index + 1}`}
        width={photo.width}
        height={photo.height}
        className="mx-auto h-auto max-h-[65vh] w-auto max-w-full rounded-control"
        data-testid="full-photo"
      />
    </Dialog>
  )
}
