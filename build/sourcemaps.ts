import { mkdir, rename, rm } from 'node:fs/promises'
import path from 'node:path'
import type { Plugin } from 'vite'

/**
 * Source maps are written (for reading a stack trace from production) but moved out of the public
 * folder into `dist/sourcemaps`, which the server never serves; the bundles carry no
 * `sourceMappingURL` comment (Vite's 'hidden' maps), so no browser asks for them.
 */
export function sourcemapsOutOfPublic(mapsDir: string): Plugin {
  let outDir = ''
  return {
    name: 'conewright:sourcemaps-out-of-public',
    apply: 'build',
    config: () => ({ build: { sourcemap: 'hidden' } }),
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir)
    },
    async buildStart() {
      await rm(mapsDir, { recursive: true, force: true })
    },
    async writeBundle(_options, bundle) {
      for (const chunk of Object.values(bundle)) {
        if (chunk.type !== 'chunk' || !chunk.sourcemapFileName) continue
        const to = path.join(mapsDir, chunk.sourcemapFileName)
        await mkdir(path.dirname(to), { recursive: true })
        await rename(path.join(outDir, chunk.sourcemapFileName), to)
      }
    },
  }
}
