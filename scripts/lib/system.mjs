// Machine set-up shared by `npm start` and `npm test`: plain Node, no dependencies, because it runs
// before `node_modules` exists.
import { spawnSync, execFileSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import net from 'node:net'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..')

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0

export function log(message) {
  process.stdout.write(`[conewright] ${message}\n`)
}

export class SetupError extends Error {}

export function commandExists(command) {
  return spawnSync('sh', ['-c', `command -v ${command}`], { stdio: 'ignore' }).status === 0
}

export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', ...options })
  if (result.status !== 0) {
    throw new SetupError(`${command} ${args.join(' ')} failed (exit ${result.status ?? result.signal})`)
  }
  return result
}

let aptUpdated = false

/** Installs Debian packages when root; otherwise says what to install and stops. */
export function ensureDebianPackages(packages, why) {
  if (!isRoot) {
    throw new SetupError(
      `${why} needs the Debian package(s) ${packages.join(', ')}. Install them as root:\n` +
        `  sudo apt-get install -y ${packages.join(' ')}\nthen run this command again.`,
    )
  }
  log(`installing ${packages.join(', ')} from Debian's packages (${why})`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  if (!aptUpdated) {
    run('apt-get', ['update', '-qq'], { env })
    aptUpdated = true
  }
  run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { env })
}

/**
 * Runs `npm ci` when node_modules is missing or was installed from another package-lock.json.
 * The stamp is ours, so a lock file edited by hand or by `git pull` triggers a fresh install.
 */
export function ensureNodeModules() {
  const lockPath = path.join(repoRoot, 'package-lock.json')
  const stampPath = path.join(repoRoot, 'node_modules', '.conewright-lock-hash')
  const lockHash = createHash('sha256').update(readFileSync(lockPath)).digest('hex')
  const current = existsSync(stampPath) ? readFileSync(stampPath, 'utf8').trim() : null
  if (current === lockHash) return
  log(existsSync(path.join(repoRoot, 'node_modules')) ? 'dependencies changed: npm ci' : 'installing dependencies: npm ci')
  run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: repoRoot })
  writeFileSync(stampPath, lockHash + '\n')
}

export function ensureChromium() {
  if (existsSync('/usr/bin/chromium')) return '/usr/bin/chromium'
  ensureDebianPackages(['chromium'], 'the end-to-end tests')
  return '/usr/bin/chromium'
}

/** A free TCP port on loopback, picked by the kernel. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer()
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address()
      server.close(() => resolve(port))
    })
  })
}

export function portInUse(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host })
    socket.once('connect', () => {
      socket.destroy()
      resolve(true)
    })
    socket.once('error', () => resolve(false))
  })
}

export function whoOwns(file) {
  try {
    return execFileSync('stat', ['-c', '%U', file], { encoding: 'utf8' }).trim()
  } catch {
    return null
  }
}
