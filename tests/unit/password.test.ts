import { describe, expect, it } from 'vitest'
import { passwordProblem } from '../../server/auth/password'
import { registerSchema } from '../../shared/schemas/auth'

// zxcvbn (the @zxcvbn-ts port from the registry) is the outside judge of guessability here.
describe('password strength', () => {
  it.each(['password1234', 'qwertyuiop12', 'conewright2026', 'iloveyou1234'])('refuses the guessable %s with a reason', (pw) => {
    expect(passwordProblem(pw, ['conewright'])).toMatch(/\w+/)
  })

  it('refuses a password built from the person’s own address', () => {
    expect(passwordProblem('hazelquist', ['hazel.quist@example.test', 'Hazel Quist'])).not.toBeNull()
  })

  it('accepts a long passphrase of unrelated words', () => {
    expect(passwordProblem('brushed-shino-over-iron-slip')).toBeNull()
  })
})

describe('registerSchema', () => {
  it('normalises the address and refuses short passwords and unknown roles', () => {
    const ok = registerSchema.parse({ email: '  Mo@Example.TEST ', password: 'a-long-enough-one', displayName: ' Mo ', role: 'host' })
    expect(ok.email).toBe('mo@example.test')
    expect(ok.displayName).toBe('Mo')
    const bad = registerSchema.safeParse({ email: 'nope', password: 'short', displayName: '', role: 'admin' })
    expect(bad.success).toBe(false)
    expect(bad.error!.issues.map((i) => i.path[0]).sort()).toEqual(['displayName', 'email', 'password', 'role'])
  })
})
