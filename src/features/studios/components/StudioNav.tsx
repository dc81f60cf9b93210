import { NavLink } from 'react-router-dom'
import type { StudioRole } from '../api/types'

/** The studio's own pages, as its owner or crew moves between them. */
export function StudioNav({ studioId, role }: { studioId: string; role: StudioRole }) {
  const links = [
    { to: '/kiln-room', label: 'Kiln room', end: true },
    { to: `/studios/${studioId}/calendar`, label: 'Calendar', end: true },
    { to: `/studios/${studioId}/incidents`, label: 'Incidents', end: true },
    ...(role === 'owner'
      ? [
          { to: `/studios/${studioId}/edit`, label: 'Studio settings', end: true },
          { to: `/studios/${studioId}/crew`, label: 'Crew', end: true },
          { to: `/studios/${studioId}/money`, label: 'Money', end: true },
        ]
      : []),
    { to: `/studios/${studioId}`, label: 'Public page', end: true },
  ]
  return (
    <nav aria-label="Studio" className="-mx-1 mb-5 flex gap-1 overflow-x-auto pb-1">
      {links.map((link) => (
        <NavLink
          key={link.to}
          to={link.to}
          end={link.end}
          className={({ isActive }) =>
            `whitespace-nowrap rounded-control px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-clay-100 text-clay-800' : 'text-slip-700 hover:bg-slip-100'}`
          }
        >
          {link.label}
        </NavLink>
      ))}
    </nav>
  )
}
