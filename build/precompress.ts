import { createHash } from 'node:crypto'
import { copyFile, mkdir, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises'
import path from 'node:path'
import { promisify } from 'node:util'
import zlib from 'node:zlib'
import type { Plugin } from 'vite'

const brotli = promisify(zlib.brotliCompress)
const gzip = promisify(zlib.gzip)

/** Text formats worth compressing; fonts (woff2) and images are compressed already. */
export const COMPRESSIBLE = /\.(js|mjs|css|html|json|svg|txt|xml|webmanifest)$/
/** Below this the headers cost more than the bytes saved. */
export const MIN_BYTES = 1024

async function* filesUnder(dir: string): AsyncGenerator<string> {
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name)
    if (entry.isDirectory()) yield* filesUnder(full)
    else yield full
  }
}

const exists = (file: string) =>
  stat(file).then(
    () => true,
    () => false,
  )

const ENCODERS = {
  br: (raw: Buffer) =>
    brotli(raw, {
      params: {
        [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
        [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
        [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
      },
    }),
  gz: (raw: Buffer) => gzip(raw, { level: zlib.constants.Z_BEST_COMPRESSION }),
}

/**
 * Writes `file.br` (brotli, best) and `file.gz` (gzip, best) beside every compressible file of the
 * built client, so the server sends them as they are instead of compressing on every request.
 * A variant that would not be smaller is not written. Best compression is slow, so each result is
 * kept in `cacheDir` by the hash of the file; what a build did not use is dropped from it.
 */
export function precompress(cacheDir: string): Plugin {
  let outDir = ''
  return {
    name: 'conewright:precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir)
    },
    async closeBundle() {
      await mkdir(cacheDir, { recursive: true })
      const used = new Set<string>()
      const jobs: Promise<void>[] = []
      for await (const file of filesUnder(outDir)) {
        if (!COMPRESSIBLE.test(file) || (await stat(file)).size < MIN_BYTES) continue
        jobs.push(
          (async () => {
            const raw = await readFile(file)
            const sha = createHash('sha256').update(raw).digest('hex')
            for (const [suffix, encode] of Object.entries(ENCODERS)) {
              const cached = path.join(cacheDir, `${sha}.${suffix}`)
              const none = `${cached}.none`
              used.add(path.basename(cached)).add(path.basename(none))
              if (await exists(cached)) await copyFile(cached, `${file}.${suffix}`)
              else if (!(await exists(none))) {
                const packed = await encode(raw)
                if (packed.length < raw.length) {
                  await writeFile(cached, packed)
                  await copyFile(cached, `${file}.${suffix}`)
                } else await writeFile(none, '')
              }
            }
          })(),
        )
      }
      await Promise.all(jobs)
      for (const entry of await readdir(cacheDir)) if (!used.has(entry)) await rm(path.join(cacheDir, entry), { force: true })
    },
  }
}
