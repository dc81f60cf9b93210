import { createHash } from 'node:crypto'
import { mkdir, readdir, readFile, rm, writeFile } from 'node:fs/promises'
import { createRequire } from 'node:module'
import path from 'node:path'
import type { Plugin } from 'vite'
import type { BasemapIndex } from '../../src/components/map/basemap-grid.ts'
import { buildBasemap, type BuiltBasemap } from './pipeline.ts'

const VIRTUAL = 'virtual:conewright-basemap'
const RESOLVED = '\0' + VIRTUAL
const require = createRequire(import.meta.url)

interface Cached {
  dir: string
  index: BasemapIndex
  files: [string, string][]
}

/**
 * What the basemap is made from: this folder's code, the grid, and the versions of the packages
 * whose data or code it uses. The same key, the same files.
 */
async function cacheKey(root: string): Promise<string> {
  const hash = createHash('sha256')
  const here = path.dirname(new URL(import.meta.url).pathname)
  for (const file of (await readdir(here)).sort()) hash.update(file).update(await readFile(path.join(here, file)))
  hash.update(await readFile(path.join(root, 'src/components/map/basemap-grid.ts')))
  for (const pkg of ['world-atlas', 'us-atlas', 'topojson-client', 'topojson-server', 'topojson-simplify'])
    hash.update(`${pkg}@${(require(`${pkg}/package.json`) as { version: string }).version}`)
  return hash.digest('hex').slice(0, 16)
}

/** Builds the basemap, or reads the one built last time from node_modules/.cache when nothing it depends on changed. */
async function loadBasemap(root: string): Promise<BuiltBasemap> {
  const cacheDir = path.join(root, 'node_modules/.cache/conewright-basemap')
  const cacheFile = path.join(cacheDir, `${await cacheKey(root)}.json`)
  try {
    const cached = JSON.parse(await readFile(cacheFile, 'utf8')) as Cached
    return { dir: cached.dir, index: cached.index, files: new Map(cached.files) }
  } catch {
    // Not built yet with these sources.
  }
  const built = buildBasemap()
  await rm(cacheDir, { recursive: true, force: true })
  await mkdir(cacheDir, { recursive: true })
  await writeFile(cacheFile, JSON.stringify({ dir: built.dir, index: built.index, files: [...built.files] } satisfies Cached))
  return built
}

/**
 * The offline basemap (build/basemap): `import index from 'virtual:conewright-basemap'` gives the map
 * its index; the build writes the files under `assets/basemap-<hash>/` (precompressed with the rest
 * of the client), and the dev server answers them from memory.
 */
export function offlineBasemap(): Plugin {
  let root = process.cwd()
  let basemap: Promise<BuiltBasemap> | null = null
  const get = () => (basemap ??= loadBasemap(root))
  return {
    name: 'conewright:offline-basemap',
    configResolved(config) {
      root = config.root
    },
    resolveId: {
      filter: { id: new RegExp(`^${VIRTUAL}$`) },
      handler: () => RESOLVED,
    },
    load: {
      filter: { id: new RegExp(`^\0${VIRTUAL}$`) },
      handler: async () => `export default ${JSON.stringify((await get()).index)}`,
    },
    async generateBundle() {
      const { dir, files } = await get()
      for (const [file, source] of files) this.emitFile({ type: 'asset', fileName: dir + file, source })
    },
    configureServer(server) {
      server.middlewares.use((req, res, next) => {
        const answer = async () => {
          const { dir, files } = await get()
          const url = req.url?.split('?')[0] ?? ''
          const source = url.startsWith(`/${dir}`) ? files.get(url.slice(dir.length + 1)) : undefined
          if (source === undefined) return next()
          res.setHeader('Content-Type', 'application/json')
          res.end(source)
        }
        answer().catch(next)
      })
    },
  }
}
