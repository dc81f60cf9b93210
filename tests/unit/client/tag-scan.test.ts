// The camera scanner's wiring without a camera: a label's QR code, drawn by the same `qrcode` package
// the labels page uses, is decoded by ZXing's QR reader (the library BrowserQRCodeReader runs on each
// video frame) and read as the piece's tag; and the words crew see when the camera does not start.
import { BinaryBitmap, HybridBinarizer, QRCodeReader, RGBLuminanceSource } from '@zxing/library'
import QRCode from 'qrcode'
import { describe, expect, it } from 'vitest'
import { newTag } from '../../../shared/firing/tags'
import { cameraProblem, tagFromScan } from '../../../src/components/pieces/scan'

/** A QR code as a greyscale frame: 6 px per module and the 4-module quiet zone the QR standard (ISO/IEC 18004) asks for. */
function frameOf(text: string) {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' })
  const scale = 6
  const quiet = 4
  const side = (modules.size + 2 * quiet) * scale
  const pixels = new Uint8ClampedArray(side * side).fill(255)
  for (let row = 0; row < modules.size; row++)
    for (let col = 0; col < modules.size; col++) {
      if (!modules.get(row, col)) continue
      for (let dy = 0; dy < scale; dy++)
        for (let dx = 0; dx < scale; dx++) pixels[((row + quiet) * scale + dy) * side + (col + quiet) * scale + dx] = 0
    }
  return { pixels, side }
}

function decode(text: string): string {
  const { pixels, side } = frameOf(text)
  const bitmap = new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(pixels, side, side)))
  return new QRCodeReader().decode(bitmap).getText()
}

describe('scanning a tag label', () => {
  const tag = newTag((n) => Uint8Array.from({ length: n }, (_, i) => (i * 37 + 11) % 256))

  it('reads the piece’s address a label’s QR code holds as its tag', () => {
    const scanned = decode(`https://conewright.example/pieces/${tag}`)
    expect(scanned).toBe(`https://conewright.example/pieces/${tag}`)
    expect(tagFromScan(scanned)).toEqual({ ok: true, tag })
  })

  it('reads a QR code holding the bare tag too, and says so when a code is no tag of ours', () => {
    expect(tagFromScan(decode(tag))).toEqual({ ok: true, tag })
    const other = tagFromScan(decode('https://example.org/menu'))
    expect(other.ok).toBe(false)
  })
})

describe('when the camera does not start', () => {
  it('names a refused permission, a missing camera and a busy one, and always points to typing', () => {
    const refused = cameraProblem(new DOMException('Permission denied', 'NotAllowedError'))
    const missing = cameraProblem(new DOMException('Requested device not found', 'NotFoundError'))
    const busy = cameraProblem(new DOMException('Could not start video source', 'NotReadableError'))
    expect(refused).toMatch(/not allowed/)
    expect(missing).toMatch(/No camera/)
    expect(busy).toMatch(/busy/)
    for (const words of [refused, missing, busy, cameraProblem(new Error('odd'))]) expect(words).toMatch(/[Tt]ype the tag/)
  })
})
