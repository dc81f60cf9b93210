import { Router, type RequestHandler } from 'express'
import type { PassportStatic } from 'passport'
import {
  type LoginBody,
  type RegisterBody,
  loginSchema,
  signInLinkConfirmSchema,
  signInLinkRequestSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  preferencesSchema,
  registerSchema,
  verifyEmailSchema,
} from '../../shared/schemas/auth'
import { requireAuth } from '../auth/guards'
import { accountKey, makeLimiter } from '../auth/rate-limit'
import type { AppContext } from '../context'
import { forbidden, HttpError } from '../http/errors'
import { acceptInvite, inviteForRegistration } from '../services/crew'
import { validateBody } from '../http/validate'
import {
  confirmPasswordReset,
  registerUser,
  updatePreferences,
  requestPasswordReset,
  resendVerification,
  publicUserWithStudios,
  requestSignInLink,
  spendSignInLink,
  verifyEmail,
} from '../services/users'
import { signInGuard } from '../auth/sign-in-guard'

const WINDOW = 15 * 60_000

export function authRouter(ctx: AppContext, passport: PassportStatic, csrfToken: RequestHandler) {
  const router = Router()
  const { authPerIpPer15Min, authPerAccountPer15Min } = ctx.config.rateLimits
  const perIp = makeLimiter(ctx.db, 'auth-ip', { limit: authPerIpPer15Min, windowMs: WINDOW })
  const guard = signInGuard(ctx)
  const resetPerAccount = makeLimiter(ctx.db, 'reset-account', { limit: 5, windowMs: WINDOW, key: accountKey })
  const registerPerAccount = makeLimiter(ctx.db, 'register-account', { limit: authPerAccountPer15Min, windowMs: WINDOW, key: accountKey })

  const signIn = (req: Parameters<RequestHandler>[0], user: Express.User) =>
    new Promise<void>((resolve, reject) => req.login(user, (error) => (error ? reject(error) : resolve())))

  router.get('/csrf', csrfToken)

  router.post('/register', perIp, validateBody(registerSchema), registerPerAccount, async (req, res) => {
    const { inviteToken, ...body } = req.body as RegisterBody
    // Registering through a crew invitation: the account joins the studio, and the mailed link has
    // already proven the address.
    if (inviteToken) await inviteForRegistration(ctx, inviteToken, body.email)
    const user = await registerUser(
      ctx,
      { ...body, role: inviteToken ? 'crew' : body.role },
      inviteToken
        ? async (manager, created) => {
            await acceptInvite(manager, created, inviteToken)
            return { addressProven: true }
          }
        : undefined,
    )
    await signIn(req, user)
    res.status(201).json(await publicUserWithStudios(ctx, user))
  })

  router.post('/login', perIp, validateBody(loginSchema), async (req, res, next) => {
    const { email } = req.body as LoginBody
    const address = req.ip ?? 'unknown'
    await guard.before(email, address)
    passport.authenticate('local', { session: false }, (error: unknown, user: Express.User | false) => {
      if (error) return next(error)
      if (!user) {
        return guard
          .failed(email, address)
          .then(() => next(new HttpError(401, 'bad-credentials', 'That e-mail and password do not match an account.')), next)
      }
      if (user.suspendedAt) return next(forbidden('This account is suspended. Write to the Conewright team.', 'suspended'))
      guard
        .succeeded(email, address)
        .then(() => signIn(req, user))
        .then(() => publicUserWithStudios(ctx, user))
        .then((json) => res.json(json), next)
    })(req, res, next)
  })

  // The way in while password sign-in is paused: a one-time link to the account's own address.
  router.post('/sign-in-link', perIp, validateBody(signInLinkRequestSchema), async (req, res) => {
    await requestSignInLink(ctx, req.body.email, `ip:${req.ip}`)
    res.status(202).json({ ok: true })
  })

  router.post('/sign-in-link/confirm', perIp, validateBody(signInLinkConfirmSchema), async (req, res) => {
    const user = await spendSignInLink(ctx, req.body.token)
    await guard.succeeded(user.email, req.ip ?? 'unknown')
    await signIn(req, user)
    res.json(await publicUserWithStudios(ctx, user))
  })

  // The stored session is deleted outright (passport's logout would save it, emptied, for 30 days);
  // a visitor with no session has nothing to end.
  router.post('/logout', (req, res, next) => {
    if (!req.user) return res.status(204).end()
    req.session.destroy((error) => (error ? next(error) : res.clearCookie('cw.sid', { path: '/' }).status(204).end()))
  })

  router.get('/me', requireAuth, async (req, res) => {
    res.json(await publicUserWithStudios(ctx, req.user!))
  })

  router.patch('/me', requireAuth, validateBody(preferencesSchema), async (req, res) => {
    res.json(await publicUserWithStudios(ctx, await updatePreferences(ctx, req.user!, req.body)))
  })

  router.post('/password-reset/request', perIp, validateBody(passwordResetRequestSchema), resetPerAccount, async (req, res) => {
    await requestPasswordReset(ctx, req.body.email, `ip:${req.ip}`)
    res.status(202).json({ ok: true })
  })

  router.post('/password-reset/confirm', perIp, validateBody(passwordResetConfirmSchema), async (req, res) => {
    await confirmPasswordReset(ctx, req.body.token, req.body.password)
    res.status(204).end()
  })

  router.post('/verify-email', perIp, validateBody(verifyEmailSchema), async (req, res) => {
    await verifyEmail(ctx, req.body.token)
    res.status(204).end()
  })

  router.post('/verify-email/resend', requireAuth, perIp, async (req, res) => {
    await resendVerification(ctx, req.user!)
    res.status(202).json({ ok: true })
  })

  return router
}
