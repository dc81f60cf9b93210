import type { PublicUser } from '../../../shared/schemas/auth'

/** Where each kind of account lands after signing in. */
export function homePath(user: Pick<PublicUser, 'role'>): string {
  switch (user.role) {
    case 'host':
    case 'crew':
      return '/kiln-room'
    case 'admin':
      return '/front-desk'
    default:
      return '/my-ware'
  }
}
