// Outside local development the server refuses secrets whose values are written in the code, so no
// one can sign a session cookie or a webhook with a value they read in the repository.
import { describe, expect, it } from 'vitest'
import { isLocalDevelopment, loadConfig, LOCAL_SECRETS, secretProblems } from '../../server/config'

const DB = { DATABASE_URL: 'postgres://nobody@127.0.0.1:9/none' }
const live = {
  ...DB,
  NODE_ENV: 'production',
  PUBLIC_URL: 'https://conewright.example',
  SESSION_SECRET: 'q'.repeat(48),
  STRIPE_SECRET_KEY: 'sk_live_abc123',
  STRIPE_WEBHOOK_SECRET: 'whsec_from_the_dashboard',
  STRIPE_CONNECT_WEBHOOK_SECRET: 'whsec_connect_from_the_dashboard',
}
const problemsOf = (env: NodeJS.ProcessEnv) => secretProblems(loadConfig(env), env)

describe('secretProblems', () => {
  it('lets local development run on the written defaults', () => {
    expect(isLocalDevelopment(loadConfig(DB), DB)).toBe(true)
    expect(problemsOf(DB)).toEqual([])
  })

  it('lets a live setup with every secret set start', () => {
    expect(problemsOf(live)).toEqual([])
  })

  it('refuses each default secret once the site is public or in production', () => {
    for (const outside of [{ PUBLIC_URL: 'https://conewright.example' }, { NODE_ENV: 'production' }]) {
      const problems = problemsOf({ ...DB, ...outside })
      expect(problems.join(' ')).toMatch(/SESSION_SECRET/)
      expect(problems.join(' ')).toMatch(/STRIPE_WEBHOOK_SECRET/)
      expect(problems.join(' ')).toMatch(/STRIPE_CONNECT_WEBHOOK_SECRET/)
      expect(problems.join(' ')).toMatch(/STRIPE_SECRET_KEY/)
    }
    expect(problemsOf({ ...live, SESSION_SECRET: LOCAL_SECRETS.sessionSecret }).join(' ')).toMatch(/SESSION_SECRET is not set/)
    expect(problemsOf({ ...live, STRIPE_WEBHOOK_SECRET: '' }).join(' ')).toMatch(/STRIPE_WEBHOOK_SECRET is not set/)
    expect(problemsOf({ ...live, STRIPE_CONNECT_WEBHOOK_SECRET: '' }).join(' ')).toMatch(/STRIPE_CONNECT_WEBHOOK_SECRET is not set/)
    expect(problemsOf({ ...live, SESSION_SECRET: 'short' }).join(' ')).toMatch(/too short/)
  })

  it('counts a live Stripe key as outside local development, even on loopback', () => {
    const env = { ...DB, STRIPE_SECRET_KEY: 'sk_live_abc123' }
    expect(isLocalDevelopment(loadConfig(env), env)).toBe(false)
    expect(problemsOf(env).join(' ')).toMatch(/STRIPE_WEBHOOK_SECRET is not set/)
  })

  it('refuses a test key where everything else looks live, unless a rehearsal site says so', () => {
    const env = { ...live, STRIPE_SECRET_KEY: 'sk_test_abc123' }
    expect(problemsOf(env).join(' ')).toMatch(/test key/)
    expect(problemsOf({ ...env, STRIPE_TEST_MODE: 'true' })).toEqual([])
  })

  it('refuses a live key sent to somewhere other than Stripe', () => {
    expect(problemsOf({ ...live, STRIPE_API_BASE: 'http://127.0.0.1:4612' }).join(' ')).toMatch(/STRIPE_API_BASE/)
  })
})
