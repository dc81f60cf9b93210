// The server process itself refuses to start on public defaults (the rules are unit-tested in
// tests/unit/secrets.test.ts); it says why and exits before it reaches for the database.
import { spawnSync } from 'node:child_process'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { repoRoot } from '../../server/config'

const DB = { DATABASE_URL: 'postgres://nobody@127.0.0.1:9/none' }

describe('the server process', () => {
  it('exits before touching the database when a public site has no session secret, and says why', () => {
    const result = spawnSync(process.execPath, ['--import', 'tsx', path.join(repoRoot, 'server/main.ts')], {
      cwd: repoRoot,
      env: { PATH: process.env.PATH, ...DB, PUBLIC_URL: 'https://conewright.example' },
      encoding: 'utf8',
      timeout: 90_000,
    })
    expect(result.status).toBe(1)
    expect(result.stderr).toMatch(/refusing to start: SESSION_SECRET is not set/)
    expect(result.stderr).toMatch(/refusing to start: STRIPE_WEBHOOK_SECRET is not set/)
  }, 120_000)
})
