import { useEffect, useRef, useState } from 'react'
import { Alert } from '../ui/Alert'
import { Button } from '../ui/Button'
import { cameraProblem, tagFromScan } from './scan'

/**
 * The rear camera reading tag labels' QR codes; loaded only when crew open it, so the barcode library
 * never weighs on pages that do not scan. Stops the camera as soon as a tag is read or it closes.
 */
export default function TagScanner({ onTag, onClose }: { onTag: (tag: string) => void; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null)
  const [problem, setProblem] = useState<string | null>(null)
  const [misread, setMisread] = useState<string | null>(null)
  const [starting, setStarting] = useState(true)

  useEffect(() => {
    let stopped = false
    let stop: (() => void) | null = null
    const start = async () => {
      if (!navigator.mediaDevices?.getUserMedia) throw Object.assign(new Error('no media devices'), { name: 'NoMediaDevices' })
      const { BrowserQRCodeReader } = await import('@zxing/browser')
      const reader = new BrowserQRCodeReader(undefined, { delayBetweenScanAttempts: 150 })
      const controls = await reader.decodeFromConstraints({ video: { facingMode: { ideal: 'environment' } } }, video.current!, (result) => {
        if (!result || stopped) return
        const reading = tagFromScan(result.getText())
        if (!reading.ok) {
          setMisread(reading.reason)
          return
        }
        stopped = true
        controls.stop()
        onTag(reading.tag)
      })
      if (stopped) controls.stop()
      else stop = () => controls.stop()
    }
    start()
      .catch((error: unknown) => !stopped && setProblem(cameraProblem(error)))
      .finally(() => !stopped && setStarting(false))
    return () => {
      stopped = true
      stop?.()
    }
  }, [onTag])

  return (
    <div className="space-y-3" data-testid="tag-scanner">
      {problem ? (
        <Alert tone="warning" title="No camera">
          {problem}
        </Alert>
      ) : (
        <>
          {/* Muted and inline so phones play the preview without going full screen. */}
          <video ref={video} className="aspect-square w-full max-w-sm rounded-card bg-slip-900 object-cover" muted playsInline />
          <p className="text-sm text-slip-700" aria-live="polite">
            {starting ? 'Starting the camera…' : (misread ?? 'Hold the label’s square code in the frame.')}
          </p>
        </>
      )}
      <Button variant="secondary" onClick={onClose} className="min-h-12 w-full sm:w-auto">
        Close the camera
      </Button>
    </div>
  )
}
