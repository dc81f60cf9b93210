import { spawnSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { log, repoRoot, SetupError } from './system.mjs'

/** A cheap fingerprint of everything the client build reads; the build is skipped when unchanged. */
function clientFingerprint() {
  const hash = createHash('sha256')
  const walk = (p) => {
    if (!existsSync(p)) return
    const stat = statSync(p)
    if (stat.isDirectory()) for (const entry of readdirSync(p).sort()) walk(path.join(p, entry))
    else hash.update(`${p}:${stat.size}:${stat.mtimeMs}\n`)
  }
  for (const p of ['src', 'shared', 'build', 'index.html', 'vite.config.ts', 'package-lock.json', 'public']) walk(path.join(repoRoot, p))
  return hash.digest('hex')
}

/** Builds the client into dist/client with Vite, unless the last build saw the same sources. */
export function buildClient() {
  const stampFile = path.join(repoRoot, 'dist', 'client', '.build-stamp')
  const fingerprint = clientFingerprint()
  if (existsSync(stampFile) && readFileSync(stampFile, 'utf8') === fingerprint) return
  log('building the client')
  const result = spawnSync(process.execPath, [path.join(repoRoot, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: repoRoot,
    stdio: 'inherit',
  })
  if (result.status !== 0) throw new SetupError('the client build failed')
  writeFileSync(stampFile, fingerprint)
}
