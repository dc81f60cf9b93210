import { useState } from 'react'
import { Link, NavLink, Outlet, useNavigate, useNavigation } from 'react-router-dom'
import type { PublicUser } from '../../shared/schemas/auth'
import { Logo } from '../components/Logo'
import { Button } from '../components/ui/Button'
import { useMe, useResendVerification, useSignOut } from '../features/auth/api/auth'
import { homePath } from '../features/auth/homePath'
import { NoticeBell } from '../features/notices/components/NoticeBell'
import { useSiteMeta } from '../lib/meta'

interface NavItem {
  to: string
  label: string
}

/** The navigation each kind of account sees; pages a role cannot use are not offered. */
export function navFor(user: PublicUser | null | undefined): NavItem[] {
  const planner = { to: '/planner', label: 'Firing planner' }
  const find = { to: '/find', label: 'Find a firing' }
  if (!user) return [find, planner]
  const home = { to: homePath(user), label: user.role === 'admin' ? 'Front desk' : user.role === 'potter' ? 'My ware' : 'Kiln room' }
  // A potter who also crews for a studio gets that studio's board too.
  const crewBoard = user.role === 'potter' && (user.studios?.length ?? 0) > 0 ? [{ to: '/kiln-room', label: 'Kiln room' }] : []
  return user.role === 'potter' ? [home, ...crewBoard, find, planner] : [home, planner]
}

function VerifyBanner({ user }: { user: PublicUser }) {
  const resend = useResendVerification()
  if (user.emailVerified) return null
  return (
    <div className="border-b border-ember-300 bg-ember-100 text-sm text-ember-700">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-3 gap-y-1 px-4 py-2">
        <span>
          Confirm your address: we mailed a link to <strong>{user.email}</strong>.
        </span>
        {resend.isSuccess ? (
          <span className="font-semibold">Sent again.</span>
        ) : (
          <button type="button" className="font-semibold underline" onClick={() => resend.mutate()} disabled={resend.isPending}>
            Send it again
          </button>
        )}
      </div>
    </div>
  )
}

export function Layout() {
  const me = useMe()
  const meta = useSiteMeta()
  const signOut = useSignOut()
  const navigate = useNavigate()
  const navigation = useNavigation()
  const [menuOpen, setMenuOpen] = useState(false)
  const user = me.data
  const items = navFor(user)

  const linkClass = ({ isActive }: { isActive: boolean }) =>
    `rounded-control px-3 py-2 text-sm font-medium ${isActive ? 'bg-clay-50 text-clay-800' : 'text-slip-700 hover:bg-slip-100'}`

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="border-b border-slip-200 bg-white/90 backdrop-blur">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-4 px-4 py-3">
          <Link to={user ? homePath(user) : '/'} aria-label="Conewright home">
            <Logo />
          </Link>
          {/* The notices stay in sight on a phone, beside the menu button. */}
          <div className="ml-auto flex items-center gap-1 md:order-last md:ml-1">
            {user && <NoticeBell />}
            <button
              type="button"
              className="rounded-control p-2 text-slip-700 hover:bg-slip-100 md:hidden"
              aria-expanded={menuOpen}
              aria-controls="main-nav"
              onClick={() => setMenuOpen((open) => !open)}
            >
              Menu
            </button>
          </div>
          <nav
            id="main-nav"
            aria-label="Main"
            className={`${menuOpen ? 'flex' : 'hidden'} absolute inset-x-0 top-14 z-40 flex-col gap-1 border-b border-slip-200 bg-white p-3 md:static md:ml-auto md:flex md:flex-row md:items-center md:border-0 md:p-0`}
          >
            {items.map((item) => (
              <NavLink key={item.to} to={item.to} className={linkClass} onClick={() => setMenuOpen(false)}>
                {item.label}
              </NavLink>
            ))}
            {user ? (
              <div className="flex items-center gap-2 md:ml-3 md:border-l md:border-slip-200 md:pl-3">
                <span className="text-sm text-slip-600" data-testid="signed-in-as">
                  {user.displayName}
                </span>
                <Button
                  variant="ghost"
                  size="sm"
                  busy={signOut.isPending}
                  onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in') })}
                >
                  Sign out
                </Button>
              </div>
            ) : (
              <div className="flex items-center gap-2 md:ml-3">
                <NavLink to="/sign-in" className={linkClass}>
                  Sign in
                </NavLink>
                <Link to="/join" className="rounded-control bg-clay-600 px-3 py-2 text-sm font-semibold text-white hover:bg-clay-700">
                  Join
                </Link>
              </div>
            )}
          </nav>
        </div>
        {navigation.state === 'loading' && <div className="h-0.5 animate-pulse bg-clay-400" aria-hidden />}
      </header>
      {user && <VerifyBanner user={user} />}
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8">
        <Outlet />
      </main>
      <footer className="border-t border-slip-200 bg-white text-sm text-slip-600">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-5">
          <span>Conewright — contract kiln firing, arranged in the open.</span>
          <span className="flex gap-4">
            <Link to="/safety" className="hover:underline">
              Firing safety
            </Link>
            {meta.data?.mailInboxUrl && (
              <a href={meta.data.mailInboxUrl} target="_blank" rel="noreferrer" className="hover:underline">
                Caught mail (local)
              </a>
            )}
          </span>
        </div>
      </footer>
    </div>
  )
}
