// A map drawn from one PMTiles file (BASEMAP_PMTILES_URL). The file is written here by hand from the
// PMTiles v3 specification (protomaps/PMTiles, spec/v3/spec.md: a 127-byte little-endian header, a
// varint root directory, JSON metadata, tile data) holding one Mapbox Vector Tile (vector-tile-spec
// 2.1: an `earth` layer with one square covering the tile, used for the four tiles of zoom 1). It is served by the test app
// from the built client's folder, the way README.md says to serve one on the same host.
import type { Browser } from 'playwright-core'
import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { repoRoot } from '../../server/config'
import { HttpSession } from '../support/http-client'
import { launchBrowser, openPage } from '../support/browser'
import { createPerson } from '../support/people'
import { publishedStudio } from '../support/studio-fixtures'
import { startTestApp, type TestApp } from '../support/test-app'
import { waitUntil } from '../support/wait'

const FILE_PATH = `/basemap/test-${process.pid}.pmtiles`
const fileOnDisk = path.join(repoRoot, 'dist/client', FILE_PATH)

/** Protocol Buffers base-128 varint. */
function varint(n: number): number[] {
  const out: number[] = []
  while (n >= 0x80) {
    out.push((n & 0x7f) | 0x80)
    n = Math.floor(n / 128)
  }
  out.push(n)
  return out
}
const zigzag = (n: number) => (n << 1) ^ (n >> 31)
const field = (num: number, wire: number) => varint((num << 3) | wire)
const bytesField = (num: number, body: number[]) => [...field(num, 2), ...varint(body.length), ...body]

/** One tile: layer `earth` (extent 4096) with one polygon, the whole tile, clockwise in tile space. */
function earthTile(): Uint8Array {
  const commands = [
    ...varint((1 << 3) | 1), // MoveTo ×1
    ...varint(zigzag(0)),
    ...varint(zigzag(0)),
    ...varint((3 << 3) | 2), // LineTo ×3
    ...[4096, 0, 0, 4096, -4096, 0].flatMap((d) => varint(zigzag(d))),
    ...varint((1 << 3) | 7), // ClosePath
  ]
  const feature = [...field(1, 0), ...varint(1), ...field(3, 0), ...varint(3 /* POLYGON */), ...bytesField(4, commands)]
  const name = [...Buffer.from('earth')]
  const layer = [...field(15, 0), ...varint(2), ...bytesField(1, name), ...bytesField(2, feature), ...field(5, 0), ...varint(4096)]
  return Uint8Array.from(bytesField(3, layer))
}

/**
 * A PMTiles v3 archive whose four zoom-1 tiles (tile ids 1 to 4, one run) share one tile's bytes,
 * uncompressed throughout. Zoom 1, not 0: the layer reads a maximum data zoom of 0 as unset.
 */
function pmtilesFile(): Buffer {
  const tile = earthTile()
  // Directory: 1 entry; tile id 1; run length 4; length; offset+1 (1 = offset 0 in the data).
  const directory = Uint8Array.from([...varint(1), ...varint(1), ...varint(4), ...varint(tile.length), ...varint(1)])
  const metadata = Buffer.from(JSON.stringify({ vector_layers: [{ id: 'earth', fields: {} }] }))
  const header = Buffer.alloc(127)
  header.write('PMTiles', 0, 'ascii')
  header.writeUInt8(3, 7)
  const rootOffset = 127
  const metadataOffset = rootOffset + directory.length
  const dataOffset = metadataOffset + metadata.length
  const u64 = (at: number, n: number) => header.writeBigUInt64LE(BigInt(n), at)
  u64(8, rootOffset)
  u64(16, directory.length)
  u64(24, metadataOffset)
  u64(32, metadata.length)
  u64(40, dataOffset) // no leaf directories
  u64(48, 0)
  u64(56, dataOffset)
  u64(64, tile.length)
  u64(72, 4) // addressed tiles
  u64(80, 1) // tile entries
  u64(88, 1) // tile contents
  header.writeUInt8(1, 96) // clustered
  header.writeUInt8(1, 97) // internal compression: none
  header.writeUInt8(1, 98) // tile compression: none
  header.writeUInt8(1, 99) // tile type: MVT
  header.writeUInt8(1, 100) // min zoom
  header.writeUInt8(1, 101) // max zoom
  header.writeInt32LE(-180e7, 102)
  header.writeInt32LE(-85e7, 106)
  header.writeInt32LE(180e7, 110)
  header.writeInt32LE(85e7, 114)
  header.writeUInt8(1, 118)
  header.writeInt32LE(0, 119)
  header.writeInt32LE(0, 123)
  return Buffer.concat([header, directory, metadata, tile])
}

let app: TestApp
let browser: Browser

beforeAll(async () => {
  mkdirSync(path.dirname(fileOnDisk), { recursive: true })
  writeFileSync(fileOnDisk, pmtilesFile())
  app = await startTestApp({
    serveClient: true,
    search: true,
    config: { basemapPmtilesUrl: FILE_PATH, tileUrl: 'https://tiles.example.test/{z}/{x}/{y}.png' },
  })
  const host = await createPerson(app, 'host', 'Wendeline Auclair')
  // A studio at 97214 (Portland, Oregon), so the search there has an answer and shows its map.
  await publishedStudio(host.session, 'Auclair Shed Kiln')
  const anyone = new HttpSession(app.url)
  await waitUntil(async () => (await anyone.get('/api/search?perPage=5')).body.total >= 1, { what: 'the index to hold the firing' })
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
  await app?.close()
  rmSync(fileOnDisk, { force: true })
})

describe('a PMTiles basemap', () => {
  it('is named to the client and drawn before the tile server, read with range requests', async () => {
    const meta = await new HttpSession(app.url).get('/api/meta')
    expect(meta.body).toMatchObject({ basemapPmtilesUrl: FILE_PATH })

    const { page, errors, context } = await openPage(browser, app.url, { viewport: { width: 412, height: 823 } })
    const reads: { range?: string; status: number }[] = []
    const otherHosts: string[] = []
    page.on('response', async (response) => {
      const url = new URL(response.url())
      if (url.pathname === FILE_PATH) reads.push({ range: (await response.request().allHeaders()).range, status: response.status() })
      else if (url.origin !== new URL(app.url).origin) otherHosts.push(url.href)
    })
    await page.goto('/find?place=Portland%2C%20OR&view=map')
    const map = page.locator('[data-testid="basemap"][data-basemap-ready="true"]')
    await map.waitFor()
    expect(await map.getAttribute('data-basemap-source')).toBe('pmtiles')
    // Read in byte ranges (the header and root directory first); this file is small enough for the
    // browser to answer the tile's range from what it already holds, so one read may be all.
    await expect.poll(() => reads.length).toBeGreaterThanOrEqual(1)
    for (const read of reads) {
      expect(read.range).toMatch(/^bytes=\d+-\d+$/)
      expect(read.status).toBe(206)
    }
    // The square drew in the light flavour's earth colour, #e2dfda (@protomaps/basemaps, LIGHT.earth),
    // not its background (#cccccc): the tile was decoded and painted.
    const pixel = await map
      .locator('canvas.leaflet-tile')
      .first()
      .evaluate((canvas: HTMLCanvasElement) => {
        const d = canvas.getContext('2d')!.getImageData(canvas.width / 2, canvas.height / 2, 1, 1).data
        return [d[0], d[1], d[2]]
      })
    expect(pixel).toEqual([0xe2, 0xdf, 0xda])
    expect(otherHosts).toEqual([])
    expect(errors).toEqual([])
    await context.close()
  })
})

describe('a PMTiles basemap on another host', () => {
  it('is a connection the page’s Content-Security-Policy allows (PMTiles reads with fetch)', async () => {
    const elsewhere = await startTestApp({ config: { basemapPmtilesUrl: 'https://maps.example.test/basemap/region.pmtiles' } })
    try {
      const res = await new HttpSession(elsewhere.url).get('/api/meta')
      expect(res.body).toMatchObject({ basemapPmtilesUrl: 'https://maps.example.test/basemap/region.pmtiles' })
      const csp = res.headers.get('content-security-policy') ?? ''
      expect(csp).toMatch(/connect-src 'self' https:\/\/maps\.example\.test(;|$)/)
    } finally {
      await elsewhere.close()
    }
  })
})
