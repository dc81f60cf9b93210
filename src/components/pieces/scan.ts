// What the camera scanner makes of what it sees and of what goes wrong, kept apart from the video so
// it can be tested without a camera.
import { readTag, type TagReading } from '../../../shared/firing/tags'

/** A scanned code as a tag: the label's QR holds the piece's address; a bare tag reads too. */
export function tagFromScan(text: string): TagReading {
  return readTag(text)
}

/** Clear words for why the camera did not start; typing the tag always works instead. */
export function cameraProblem(error: unknown): string {
  const name =
    error instanceof Error || (typeof error === 'object' && error !== null && 'name' in error) ? String((error as Error).name) : ''
  switch (name) {
    case 'NotAllowedError':
    case 'SecurityError':
      return 'The camera was not allowed. Allow it for this site in the browser’s settings, or type the tag below.'
    case 'NotFoundError':
    case 'OverconstrainedError':
      return 'No camera was found on this device. Type the tag below.'
    case 'NotReadableError':
    case 'AbortError':
      return 'The camera is busy in another app. Close it there and try again, or type the tag below.'
    case 'NoMediaDevices':
      return 'This browser offers no camera here (it needs a secure https address). Type the tag below.'
    default:
      return 'The camera could not start. Type the tag below.'
  }
}
