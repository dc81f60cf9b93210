import { lazy, Suspense, useCallback, useState, type FormEvent } from 'react'
import { readTag } from '../../../shared/firing/tags'
import { Button } from '../ui/Button'
import { TextInput } from '../ui/Field'

const TagScanner = lazy(() => import('./TagScanner'))

/**
 * Find a piece by its tag: typed (any case, with or without the dash), or read from its label with
 * the camera. Typing always works, camera or not.
 */
export function FindPiece({ onTag, label = 'Find a piece' }: { onTag: (tag: string) => void; label?: string }) {
  const [typed, setTyped] = useState('')
  const [problem, setProblem] = useState<string | null>(null)
  const [scanning, setScanning] = useState(false)

  const submit = (event: FormEvent) => {
    event.preventDefault()
    const reading = readTag(typed)
    if (!reading.ok) {
      setProblem(reading.reason)
      return
    }
    setProblem(null)
    onTag(reading.tag)
  }
  const scanned = useCallback(
    (tag: string) => {
      setScanning(false)
      onTag(tag)
    },
    [onTag],
  )

  return (
    <div className="space-y-3">
      <form onSubmit={submit} className="flex flex-wrap items-end gap-2" aria-label={label} role="search">
        <div className="min-w-0 flex-1 space-y-1">
          <label htmlFor="find-piece-tag" className="block text-sm font-medium text-slip-800">
            {label}: type its tag
          </label>
          <TextInput
            id="find-piece-tag"
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
            placeholder="K4XR-7M2H"
            autoCapitalize="characters"
            autoComplete="off"
            spellCheck={false}
            className="min-h-12 font-mono text-lg tracking-wider"
            aria-invalid={problem !== null}
            aria-describedby={problem ? 'find-piece-problem' : undefined}
          />
        </div>
        <Button type="submit" className="min-h-12">
          Open
        </Button>
        {!scanning && (
          <Button variant="secondary" className="min-h-12" onClick={() => setScanning(true)}>
            Scan with the camera
          </Button>
        )}
      </form>
      {problem && (
        <p id="find-piece-problem" role="alert" className="text-sm font-medium text-danger-700">
          {problem}
        </p>
      )}
      {scanning && (
        <Suspense fallback={<p className="text-sm text-slip-600">Opening the camera…</p>}>
          <TagScanner onTag={scanned} onClose={() => setScanning(false)} />
        </Suspense>
      )}
    </div>
  )
}
