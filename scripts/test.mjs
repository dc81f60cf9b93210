#!/usr/bin/env node
// `npm test`: every test, end-to-end included, from a fresh machine. Installs what is missing
// (npm packages; PostgreSQL and Chromium from Debian's packages when root), type-checks, lints, checks
// the format, builds the client, then runs Vitest, whose global setup starts a throwaway PostgreSQL cluster and removes it.
// Extra arguments go to Vitest (e.g. `npm test -- tests/unit`).
import { spawnSync } from 'node:child_process'
import path from 'node:path'
import { buildClient } from './lib/client-build.mjs'
import { ensurePostgresInstalled } from './lib/postgres.mjs'
import { ensureChromium, ensureNodeModules, log, repoRoot, SetupError } from './lib/system.mjs'

function step(name, command, args) {
  log(name)
  const result = spawnSync(command, args, { cwd: repoRoot, stdio: 'inherit', env: process.env })
  if (result.status !== 0) throw new SetupError(`${name} failed`)
}

try {
  ensureNodeModules()
  ensurePostgresInstalled()
  ensureChromium()
  step('type-checking', process.execPath, [path.join(repoRoot, 'node_modules/typescript/bin/tsc'), '--noEmit', '-p', 'tsconfig.json'])
  step('linting', process.execPath, [path.join(repoRoot, 'node_modules/eslint/bin/eslint.js'), '.'])
  step('checking the format', process.execPath, [
    path.join(repoRoot, 'node_modules/prettier/bin/prettier.cjs'),
    '--check',
    '--log-level',
    'warn',
    '.',
  ])
  buildClient()
  step('running the tests', process.execPath, [path.join(repoRoot, 'node_modules/vitest/vitest.mjs'), 'run', ...process.argv.slice(2)])
} catch (error) {
  process.stderr.write(`[conewright] ${error instanceof SetupError ? error.message : error.stack}\n`)
  process.exit(1)
}
