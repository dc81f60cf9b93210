import { useEffect, useId, useRef, useState, type DragEvent, type ReactNode } from 'react'
import { ApiError, uploadWithProgress } from '../../lib/api'
import { Button } from '../ui/Button'
import type { PhotoRecord } from './photoTypes'

/** The server's limits (server/services/photos.ts): it re-checks every file by its bytes anyway. */
const MAX_BYTES = 12 * 1024 * 1024
const ACCEPTED_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/gif', 'image/avif', 'image/tiff']
/** Two at a time keeps a phone's upload link busy without starving the page's other requests. */
const AT_ONCE = 2

type UploadStatus = 'waiting' | 'sending' | 'done' | 'failed' | 'refused'

interface UploadItem {
  key: string
  name: string
  bytes: number
  preview: string
  status: UploadStatus
  /** 0 to 1, while sending. */
  progress: number
  error: string | null
  photo: PhotoRecord | null
}

interface PhotoUploaderProps {
  /** Where the photos go: a multipart POST, each file in the field `photos`, beside `fields`. */
  uploadUrl: string
  fields: Record<string, string>
  /** What the photos are of, e.g. "Drop-off photos"; names the drop zone and the file picker. */
  label: string
  hint?: ReactNode
  /** Called once per stored file, so the page can show it where it belongs. */
  onUploaded: (photos: PhotoRecord[]) => void
  disabled?: boolean
}

const sizeInWords = (bytes: number) =>
  bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`

function refusalOf(file: File): string | null {
  if (file.type && !file.type.startsWith('image/')) return 'Not a photo: choose a JPEG, PNG, WebP, GIF, AVIF or TIFF image.'
  if (file.size > MAX_BYTES) return `Over ${MAX_BYTES / 1024 / 1024} MB: send a smaller copy of this photo.`
  if (file.size === 0) return 'This file is empty.'
  return null
}

function problemOf(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 413) return `Over ${MAX_BYTES / 1024 / 1024} MB: send a smaller copy of this photo.`
    return error.message
  }
  return 'The upload failed. Check your connection and try again.'
}

/**
 * Photos dropped or picked, several at once, each sent on its own with its own progress bar, so a
 * failed one can be retried without sending the rest again. Stored photos show as thumbnails.
 */
export function PhotoUploader({ uploadUrl, fields, label, hint, onUploaded, disabled = false }: PhotoUploaderProps) {
  const inputId = useId()
  const hintId = useId()
  const inputRef = useRef<HTMLInputElement>(null)
  const [items, setItems] = useState<UploadItem[]>([])
  const [dragging, setDragging] = useState(false)
  const files = useRef(new Map<string, File>())
  const waiting = useRef<string[]>([])
  const active = useRef(new Map<string, AbortController>())
  const mounted = useRef(false)
  const latest = useRef({ uploadUrl, fields, onUploaded })
  useEffect(() => {
    latest.current = { uploadUrl, fields, onUploaded }
  })

  useEffect(() => {
    mounted.current = true
    const controllers = active.current
    const known = files.current
    return () => {
      mounted.current = false
      for (const controller of controllers.values()) controller.abort()
      known.clear()
    }
  }, [])

  // Previews are object URLs; each is given back when its row goes or the uploader closes.
  const previews = useRef(new Set<string>())
  useEffect(() => {
    const urls = previews.current
    return () => {
      for (const url of urls) URL.revokeObjectURL(url)
      urls.clear()
    }
  }, [])

  const patch = (key: string, change: Partial<UploadItem>) => {
    if (mounted.current) setItems((list) => list.map((item) => (item.key === key ? { ...item, ...change } : item)))
  }

  const send = async (key: string) => {
    const file = files.current.get(key)
    if (!file) return
    const controller = new AbortController()
    active.current.set(key, controller)
    patch(key, { status: 'sending', progress: 0, error: null })
    const { uploadUrl: url, fields: extra } = latest.current
    const form = new FormData()
    for (const [name, value] of Object.entries(extra)) form.append(name, value)
    form.append('photos', file, file.name)
    try {
      const answer = await uploadWithProgress<{ photos: PhotoRecord[] }>(url, form, {
        signal: controller.signal,
        onProgress: (share) => patch(key, { progress: share }),
      })
      patch(key, { status: 'done', progress: 1, photo: answer.photos[0] ?? null })
      files.current.delete(key)
      if (mounted.current) latest.current.onUploaded(answer.photos)
    } catch (error) {
      if ((error as Error).name === 'AbortError') patch(key, { status: 'failed', error: 'Stopped before it finished.' })
      else patch(key, { status: 'failed', error: problemOf(error) })
    } finally {
      active.current.delete(key)
      pump()
    }
  }

  const pump = () => {
    while (mounted.current && active.current.size < AT_ONCE && waiting.current.length > 0) void send(waiting.current.shift()!)
  }

  const add = (chosen: FileList | File[]) => {
    const added: UploadItem[] = []
    for (const file of Array.from(chosen)) {
      const key = `${Date.now()}-${Math.random().toString(36).slice(2)}`
      const refusal = refusalOf(file)
      const preview = !refusal ? URL.createObjectURL(file) : ''
      if (preview) previews.current.add(preview)
      added.push({
        key,
        name: file.name,
        bytes: file.size,
        preview,
        status: refusal ? 'refused' : 'waiting',
        progress: 0,
        error: refusal,
        photo: null,
      })
      if (!refusal) {
        files.current.set(key, file)
        waiting.current.push(key)
      }
    }
    setItems((list) => [...list, ...added])
    pump()
  }

  const retry = (key: string) => {
    if (!files.current.has(key)) return
    patch(key, { status: 'waiting', progress: 0, error: null })
    waiting.current.push(key)
    pump()
  }

  const remove = (key: string) => {
    active.current.get(key)?.abort()
    files.current.delete(key)
    waiting.current = waiting.current.filter((k) => k !== key)
    setItems((list) => {
      const gone = list.find((item) => item.key === key)
      if (gone?.preview) {
        URL.revokeObjectURL(gone.preview)
        previews.current.delete(gone.preview)
      }
      return list.filter((item) => item.key !== key)
    })
  }

  const clearFinished = () => {
    for (const item of items) if (item.status === 'done' || item.status === 'refused') remove(item.key)
  }

  const onDrop = (event: DragEvent) => {
    event.preventDefault()
    setDragging(false)
    if (!disabled && event.dataTransfer.files.length > 0) add(event.dataTransfer.files)
  }

  const sending = items.filter((item) => item.status === 'sending' || item.status === 'waiting').length
  const finished = items.filter((item) => item.status === 'done' || item.status === 'refused').length

  return (
    <div className="space-y-3" data-testid="photo-uploader">
      <div
        role="group"
        aria-label={label}
        aria-describedby={hint ? hintId : undefined}
        onDragEnter={(event) => {
          event.preventDefault()
          if (!disabled) setDragging(true)
        }}
        onDragOver={(event) => {
          event.preventDefault()
          event.dataTransfer.dropEffect = disabled ? 'none' : 'copy'
        }}
        onDragLeave={(event) => {
          if (!event.currentTarget.contains(event.relatedTarget as Node | null)) setDragging(false)
        }}
        onDrop={onDrop}
        className={`flex flex-col items-center gap-2 rounded-card border-2 border-dashed px-4 py-6 text-center transition-colors ${
          dragging ? 'border-clay-500 bg-clay-50' : 'border-slip-300 bg-slip-50'
        } ${disabled ? 'opacity-60' : ''}`}
      >
        <p className="text-sm font-medium text-slip-800">{label}</p>
        <p className="text-sm text-slip-600">Drop photos here, or</p>
        <Button variant="secondary" size="sm" disabled={disabled} onClick={() => inputRef.current?.click()}>
          Choose photos…
        </Button>
        <input
          ref={inputRef}
          id={inputId}
          type="file"
          multiple
          accept={ACCEPTED_TYPES.join(',')}
          className="sr-only"
          tabIndex={-1}
          aria-label={`${label}: choose files`}
          disabled={disabled}
          data-testid="photo-input"
          onChange={(event) => {
            if (event.target.files?.length) add(event.target.files)
            event.target.value = ''
          }}
        />
        {hint && (
          <p id={hintId} className="text-xs text-slip-500">
            {hint}
          </p>
        )}
        <p className="text-xs text-slip-500">
          JPEG, PNG, WebP, GIF, AVIF or TIFF, up to {MAX_BYTES / 1024 / 1024} MB each. Location and camera details are removed.
        </p>
      </div>

      {items.length > 0 && (
        <>
          <p className="sr-only" aria-live="polite">
            {sending > 0 ? `${sending} ${sending === 1 ? 'photo' : 'photos'} still uploading.` : 'Uploads finished.'}
          </p>
          <ul className="space-y-2" aria-label={`${label}: uploads`}>
            {items.map((item) => (
              <UploadRow key={item.key} item={item} onRetry={() => retry(item.key)} onRemove={() => remove(item.key)} />
            ))}
          </ul>
          {finished > 0 && sending === 0 && (
            <Button variant="ghost" size="sm" onClick={clearFinished}>
              Clear the list
            </Button>
          )}
        </>
      )}
    </div>
  )
}

const STATUS_WORDS: Record<UploadStatus, string> = {
  waiting: 'Waiting',
  sending: 'Uploading',
  done: 'Uploaded',
  failed: 'Not uploaded',
  refused: 'Not uploaded',
}

function UploadRow({ item, onRetry, onRemove }: { item: UploadItem; onRetry: () => void; onRemove: () => void }) {
  const percent = Math.round(item.progress * 100)
  const thumb = item.photo?.thumbUrl ?? item.preview
  const broken = item.status === 'failed' || item.status === 'refused'
  return (
    <li
      className={`flex items-center gap-3 rounded-control border bg-white p-2 ${broken ? 'border-danger-500/40' : 'border-slip-200'}`}
      data-testid="upload-item"
      data-status={item.status}
    >
      <div className="size-14 shrink-0 overflow-hidden rounded-control bg-slip-100">
        {thumb ? (
          <img src={thumb} alt={`Preview of ${item.name}`} className="size-full object-cover" />
        ) : (
          <span className="flex size-full items-center justify-center text-xs text-slip-500">—</span>
        )}
      </div>
      <div className="min-w-0 flex-1 space-y-1">
        <p className="flex flex-wrap items-baseline gap-x-2 text-sm">
          <span className="truncate font-medium text-slip-900" title={item.name}>
            {item.name}
          </span>
          <span className="text-xs text-slip-500">{sizeInWords(item.bytes)}</span>
        </p>
        {(item.status === 'sending' || item.status === 'waiting') && (
          <div
            role="progressbar"
            aria-label={`Uploading ${item.name}`}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={percent}
            className="h-1.5 w-full overflow-hidden rounded-full bg-slip-200"
          >
            <div className="h-full rounded-full bg-clay-500 transition-[width]" style={{ width: `${percent}%` }} />
          </div>
        )}
        <p
          className={`text-xs ${broken ? 'font-medium text-danger-700' : item.status === 'done' ? 'text-celadon-700' : 'text-slip-600'}`}
          role={broken ? 'alert' : undefined}
        >
          {item.status === 'sending'
            ? `${STATUS_WORDS.sending} · ${percent} %`
            : item.status === 'done'
              ? '✓ Uploaded'
              : (item.error ?? STATUS_WORDS[item.status])}
        </p>
      </div>
      <div className="flex shrink-0 flex-col gap-1 sm:flex-row">
        {item.status === 'failed' && (
          <Button size="sm" variant="secondary" onClick={onRetry} aria-label={`Retry ${item.name}`}>
            Retry
          </Button>
        )}
        {item.status !== 'done' && (
          <Button size="sm" variant="ghost" onClick={onRemove} aria-label={`${item.status === 'sending' ? 'Stop' : 'Remove'} ${item.name}`}>
            {item.status === 'sending' ? 'Stop' : 'Remove'}
          </Button>
        )}
      </div>
    </li>
  )
}
