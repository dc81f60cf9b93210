import type { EntityManager } from 'typeorm'
import type { UserRole } from '../../shared/schemas/auth'
import { hashPassword } from '../auth/password'
import type { AppContext } from '../context'
import { User } from '../entities/User'
import { seedDemoIncident } from './demo-incidents'
import { regionalDemoStudios } from './demo-region'
import { seedDemoRequests } from './demo-requests'
import { DEMO_STUDIOS, seedDemoStudios } from './demo-studios'

/** Every demo account shares this password; the README lists the accounts. */
export const DEMO_PASSWORD = 'glaze-and-fire-demo'

export interface DemoPerson {
  email: string
  displayName: string
  role: UserRole
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: 'wren.alvarado@demo.conewright.test', displayName: 'Wren Alvarado', role: 'potter' },
  { email: 'theo.marsh@demo.conewright.test', displayName: 'Theo Marsh', role: 'potter' },
  { email: 'admin@demo.conewright.test', displayName: 'Conewright Desk', role: 'admin' },
]

/** Finds or creates a demo account by address: running the seed twice adds nothing. */
export async function ensureDemoUser(manager: EntityManager, person: DemoPerson, passwordHash: string): Promise<User> {
  const users = manager.getRepository(User)
  const existing = await users.findOne({ where: { email: person.email } })
  if (existing) return existing
  return users.save(users.create({ ...person, passwordHash, emailVerifiedAt: new Date(), suspendedAt: null, unitSystem: 'imperial' }))
}

export async function seedDemo(ctx: AppContext) {
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await ctx.db.transaction(async (manager) => {
    // One seed at a time, even with several processes starting together.
    await manager.query(`SELECT pg_advisory_xact_lock(hashtext('conewright-demo-seed'))`)
    for (const person of DEMO_PEOPLE) await ensureDemoUser(manager, person, passwordHash)
    await seedDemoStudios(manager, [...DEMO_STUDIOS, ...regionalDemoStudios()], (person) => ensureDemoUser(manager, person, passwordHash))
    await seedDemoRequests(manager, async (email) => (await manager.getRepository(User).findOneByOrFail({ email })).id)
  })
  // After the requests are in: the incident is reported through the app's own services, photo and all.
  await seedDemoIncident(ctx)
}
