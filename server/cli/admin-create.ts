// npm run admin:create -- email [display name]
// Creates a marketplace admin, or makes an existing account one. The password comes from
// ADMIN_PASSWORD, or a random one is made and printed once.
import { randomBytes } from 'node:crypto'
import { z } from 'zod'
import { hashPassword, passwordProblem } from '../auth/password'
import { User } from '../entities/User'
import { withDatabase } from './local-database'

const [emailArg, ...nameParts] = process.argv.slice(2)
const email = z.email().safeParse(emailArg?.trim().toLowerCase())
if (!email.success) {
  console.error('usage: npm run admin:create -- admin@example.com [Display Name]')
  process.exit(2)
}

const chosen = process.env.ADMIN_PASSWORD
const password = chosen ?? randomBytes(15).toString('base64url')
if (chosen) {
  const problem = passwordProblem(chosen, [email.data])
  if (problem) {
    console.error(`ADMIN_PASSWORD is too weak: ${problem}`)
    process.exit(2)
  }
}

await withDatabase(async (db) => {
  const users = db.getRepository(User)
  const existing = await users.findOne({ where: { email: email.data } })
  if (existing) {
    await users.update(existing.id, { role: 'admin', ...(chosen ? { passwordHash: await hashPassword(chosen) } : {}) })
    console.log(`${email.data} is now an admin${chosen ? ' with the password from ADMIN_PASSWORD' : ' (password unchanged)'}.`)
    return
  }
  await users.save(
    users.create({
      email: email.data,
      displayName: nameParts.join(' ') || 'Conewright admin',
      role: 'admin',
      passwordHash: await hashPassword(password),
      emailVerifiedAt: new Date(),
      suspendedAt: null,
    }),
  )
  console.log(`Created admin ${email.data}.`)
  if (!chosen) console.log(`Password (shown once): ${password}`)
})
