import bcrypt from 'bcryptjs'
import type { UserRole } from '../../shared/schemas/auth'
import { User } from '../../server/entities/User'
import { BCRYPT_COST } from '../../server/auth/password'
import { HttpSession } from './http-client'
import type { TestApp } from './test-app'

export const PERSON_PASSWORD = 'test-person-long-passphrase'
let sharedHash: string | null = null
let counter = 0

export interface Person {
  id: string
  email: string
  session: HttpSession
}

/**
 * A verified account made straight in the database (registration has its own tests), signed in
 * through the API like anyone else.
 */
export async function createPerson(app: TestApp, role: UserRole, name = `Person ${counter + 1}`): Promise<Person> {
  sharedHash ??= await bcrypt.hash(PERSON_PASSWORD, BCRYPT_COST)
  const email = `${role}${++counter}.${Date.now()}@example.test`
  const user = await app.ctx.db.getRepository(User).save({
    email,
    passwordHash: sharedHash,
    displayName: name,
    role,
    emailVerifiedAt: new Date(),
    suspendedAt: null,
  })
  const session = new HttpSession(app.url)
  const reply = await session.signIn(email, PERSON_PASSWORD)
  if (reply.status !== 200) throw new Error(`could not sign in ${email}: ${reply.status}`)
  return { id: user.id, email, session }
}
