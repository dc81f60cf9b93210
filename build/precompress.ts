import { readdir, readFile, stat, writeFile } from 'node:fs/promises'
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

/**
 * Writes `file.br` (brotli, best) and `file.gz` (gzip, best) beside every compressible file of the
 * built client, so the server sends them as they are instead of compressing on every request.
 * A variant that would not be smaller is not written.
 */
export function precompress(): Plugin {
  let outDir = ''
  return {
    name: 'conewright:precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir)
    },
    async closeBundle() {
      const jobs: Promise<void>[] = []
      for await (const file of filesUnder(outDir)) {
        if (!COMPRESSIBLE.test(file) || (await stat(file)).size < MIN_BYTES) continue
        jobs.push(
          (async () => {
            const raw = await readFile(file)
            const [br, gz] = await Promise.all([
              brotli(raw, {
                params: {
                  [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
                  [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
                  [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
                },
              }),
              gzip(raw, { level: zlib.constants.Z_BEST_COMPRESSION }),
            ])
            if (br.length < raw.length) await writeFile(`${file}.br`, br)
            if (gz.length < raw.length) await writeFile(`${file}.gz`, gz)
          })(),
        )
      }
      await Promise.all(jobs)
    },
  }
}
