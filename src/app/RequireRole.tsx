import type { ReactNode } from 'react'
import { Navigate, useLocation } from 'react-router-dom'
import type { UserRole } from '../../shared/schemas/auth'
import { Alert } from '../components/ui/Alert'
import { Spinner } from '../components/ui/Spinner'
import { useMe } from '../features/auth/api/auth'
import { homePath } from '../features/auth/homePath'

/** Sends visitors to sign in (and back afterwards) and other roles to their own home. */
export function RequireRole({ roles, children }: { roles: UserRole[]; children: ReactNode }) {
  const me = useMe()
  const location = useLocation()
  if (me.isPending) return <Spinner />
  if (me.isError) return <Alert tone="danger">Could not check your sign-in: {me.error.message}</Alert>
  if (!me.data) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />
  // Someone on a studio's crew works its board whatever their account's own role is.
  const crews = (me.data.studios?.length ?? 0) > 0 && (roles.includes('crew') || roles.includes('host'))
  if (me.data.role !== 'admin' && !roles.includes(me.data.role) && !crews) return <Navigate to={homePath(me.data)} replace />
  return <>{children}</>
}
