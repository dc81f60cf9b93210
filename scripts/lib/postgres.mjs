// A private PostgreSQL cluster from Debian's packages, on 127.0.0.1 and a port of our own.
// initdb and postgres refuse to run as root, so as root every server command runs as the
// `postgres` user, in a directory that user owns.
import { spawnSync } from 'node:child_process'
import { createHash, randomBytes } from 'node:crypto'
import { chownSync, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync, readFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { ensureDebianPackages, isRoot, log, repoRoot, SetupError } from './system.mjs'

const DEBIAN_PG_ROOT = '/usr/lib/postgresql'

export function findPgBinDir() {
  if (!existsSync(DEBIAN_PG_ROOT)) return null
  const versions = readdirSync(DEBIAN_PG_ROOT)
    .filter((v) => existsSync(path.join(DEBIAN_PG_ROOT, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a))
  return versions.length ? path.join(DEBIAN_PG_ROOT, versions[0], 'bin') : null
}

/** The server binaries, installed from Debian's `postgresql` package when root and missing. */
export function ensurePostgresInstalled() {
  let binDir = findPgBinDir()
  if (!binDir) {
    ensureDebianPackages(['postgresql'], 'the database (PostgreSQL)')
    binDir = findPgBinDir()
    if (!binDir) throw new SetupError('PostgreSQL was installed but no initdb was found under /usr/lib/postgresql')
  }
  return binDir
}

function postgresIds() {
  const uid = Number(spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).stdout.trim())
  const gid = Number(spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).stdout.trim())
  if (!Number.isInteger(uid) || !Number.isInteger(gid)) {
    throw new SetupError('running as root, but there is no `postgres` user to run the database as')
  }
  return { uid, gid }
}

/** Makes a directory the server user owns; returns false when that user cannot reach it. */
function prepareServerDir(dir) {
  mkdirSync(dir, { recursive: true, mode: 0o700 })
  if (!isRoot) return true
  const { uid, gid } = postgresIds()
  chownSync(dir, uid, gid)
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir]).status === 0
}

export class Cluster {
  /** @param {{ baseDir: string, port: number, user?: string, binDir?: string }} options */
  constructor({ baseDir, port, user = 'conewright', binDir }) {
    this.baseDir = baseDir
    this.dataDir = path.join(baseDir, 'data')
    this.logFile = path.join(baseDir, 'postgres.log')
    this.port = port
    this.user = user
    this.binDir = binDir ?? ensurePostgresInstalled()
  }

  exec(program, args, { quiet = false } = {}) {
    const bin = path.join(this.binDir, program)
    const [command, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args]
    const result = spawnSync(command, argv, { encoding: 'utf8', cwd: '/' })
    if (result.status !== 0 && !quiet) {
      throw new SetupError(`${program} failed (exit ${result.status}):\n${result.stderr || result.stdout}`)
    }
    return result
  }

  get initialized() {
    return existsSync(path.join(this.dataDir, 'PG_VERSION'))
  }

  /** First-time set-up. With a password the cluster uses scram; without, trust (throwaway clusters). */
  init({ password } = {}) {
    const args = ['-D', this.dataDir, '-U', this.user, '--encoding=UTF8', '--locale=C.UTF-8']
    let pwFile
    if (password) {
      pwFile = path.join(this.baseDir, '.pw-init')
      writeFileSync(pwFile, password + '\n', { mode: 0o644 })
      args.push('--auth=scram-sha-256', `--pwfile=${pwFile}`)
    } else {
      args.push('--auth=trust')
    }
    try {
      this.exec('initdb', args)
    } finally {
      if (pwFile) rmSync(pwFile, { force: true })
    }
  }

  isRunning() {
    return this.exec('pg_ctl', ['-D', this.dataDir, 'status'], { quiet: true }).status === 0
  }

  start() {
    const options = [
      `-p ${this.port}`,
      "-c listen_addresses='127.0.0.1'",
      "-c unix_socket_directories=''",
      '-c max_connections=200',
      '-c shared_buffers=128MB',
    ].join(' ')
    this.exec('pg_ctl', ['-D', this.dataDir, '-l', this.logFile, '-o', options, '-w', '-t', '60', 'start'])
  }

  stop() {
    if (this.isRunning()) this.exec('pg_ctl', ['-D', this.dataDir, '-m', 'fast', '-w', 'stop'], { quiet: true })
  }

  url(database, password) {
    const auth = password ? `${this.user}:${encodeURIComponent(password)}` : this.user
    return `postgres://${auth}@127.0.0.1:${this.port}/${database}`
  }
}

/**
 * The cluster `npm start` keeps between runs. Its data lives in var/postgres inside the checkout when
 * the server user can reach it, otherwise under /var/lib/conewright/<checkout hash>.
 */
export function persistentCluster(port) {
  const stateFile = path.join(repoRoot, 'var', 'database.json')
  mkdirSync(path.dirname(stateFile), { recursive: true })
  let state = existsSync(stateFile) ? JSON.parse(readFileSync(stateFile, 'utf8')) : null
  if (!state) {
    let baseDir = path.join(repoRoot, 'var', 'postgres')
    if (!prepareServerDir(baseDir)) {
      rmSync(baseDir, { recursive: true, force: true })
      const hash = createHash('sha256').update(repoRoot).digest('hex').slice(0, 12)
      baseDir = path.join('/var/lib/conewright', hash)
      mkdirSync('/var/lib/conewright', { recursive: true, mode: 0o755 })
      if (!prepareServerDir(baseDir)) throw new SetupError(`the postgres user cannot write to ${baseDir}`)
      log(`the postgres user cannot reach this checkout; the database lives in ${baseDir}`)
    }
    state = { baseDir, password: randomBytes(18).toString('base64url') }
    writeFileSync(stateFile, JSON.stringify(state, null, 2) + '\n', { mode: 0o600 })
  }
  prepareServerDir(state.baseDir)
  const cluster = new Cluster({ baseDir: state.baseDir, port })
  if (!cluster.initialized) {
    log(`creating the database cluster in ${cluster.dataDir}`)
    cluster.init({ password: state.password })
  }
  return { cluster, password: state.password }
}

/** A cluster for one test run, in a fresh temporary directory; `remove()` deletes it. */
export function throwawayCluster(port) {
  const baseDir = mkdtempSync(path.join(os.tmpdir(), 'conewright-test-pg-'))
  prepareServerDir(baseDir)
  const cluster = new Cluster({ baseDir, port })
  cluster.init()
  return {
    cluster,
    remove() {
      cluster.stop()
      rmSync(baseDir, { recursive: true, force: true })
    },
  }
}
