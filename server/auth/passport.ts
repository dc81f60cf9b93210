import passport from 'passport'
import { Strategy as LocalStrategy } from 'passport-local'
import type { AppContext } from '../context'
import { User as UserEntity } from '../entities/User'
import { authenticate } from '../services/users'

declare global {
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type -- passport's user is our entity
    interface User extends UserEntity {}
  }
}

/** A passport instance of our own (not the global singleton), so test apps do not share strategies. */
export function createPassport(ctx: AppContext) {
  const instance = new passport.Passport()
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      authenticate(ctx, email, password).then(
        (user) => done(null, user ?? false),
        (error) => done(error),
      )
    }),
  )
  instance.serializeUser((user, done) => done(null, (user as UserEntity).id))
  instance.deserializeUser((id: string, done) => {
    ctx.db
      .getRepository(UserEntity)
      .findOne({ where: { id } })
      // A deleted or suspended account simply has no session any more.
      .then((user) => done(null, user && !user.suspendedAt ? user : false), done)
  })
  return instance
}
