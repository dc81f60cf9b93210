import type { ComponentType } from 'react'
import type { RouteObject } from 'react-router-dom'
import type { UserRole } from '../../shared/schemas/auth'
import { LandingPage } from '../features/home/pages/LandingPage'
import { FIND_HEADING } from '../features/search/heading'
import { ErrorPage, NotFoundPage } from './ErrorPage'
import { Layout } from './Layout'
import { PageSkeleton } from './PageSkeleton'
import { pages, type PageName } from './pages'
import { RequireRole } from './RequireRole'
import { RouteHeading } from './RouteHeading'

export interface PageHandle {
  page: PageName
  /** Drawn above the page by RouteHeading (the page draws no heading of its own), from the first paint on. */
  heading?: { title: string; lead?: string }
}

const studioSide: UserRole[] = ['host', 'crew']

/**
 * A route whose page is a chunk of its own, loaded by the router when the route is first opened
 * (the old page stays, with the progress line, until it is in); RequireRole wraps it when the page
 * needs an account.
 */
function page<K extends keyof typeof pages>(
  name: K,
  pick: (module: Awaited<ReturnType<(typeof pages)[K]>>) => ComponentType,
  roles?: UserRole[],
  heading?: PageHandle['heading'],
): Pick<RouteObject, 'lazy' | 'handle'> {
  return {
    handle: { page: name, heading } satisfies PageHandle,
    lazy: async () => {
      const load = pages[name] as () => Promise<Awaited<ReturnType<(typeof pages)[K]>>>
      const Page = pick(await load())
      return {
        element: roles ? (
          <RequireRole roles={roles}>
            <Page />
          </RequireRole>
        ) : (
          <Page />
        ),
      }
    },
  }
}

export const routes: RouteObject[] = [
  {
    element: <Layout />,
    errorElement: <ErrorPage />,
    children: [
      {
        // A route's named heading is drawn here, above the page, so it is the same element before
        // and after the page's code arrives.
        element: <RouteHeading />,
        children: [
          {
            // On a first visit to a lazy page the header and footer are drawn at once and the page's
            // place holds a skeleton until its chunk arrives.
            HydrateFallback: PageSkeleton,
            children: [
              // The landing page is in the main chunk: the first thing most people see needs no second trip.
              { index: true, element: <LandingPage />, handle: { page: 'landing' } satisfies PageHandle },
              { path: 'sign-in', ...page('signIn', (m) => m.SignInPage) },
              { path: 'join', ...page('register', (m) => m.RegisterPage) },
              { path: 'verify-email', ...page('verifyEmail', (m) => m.VerifyEmailPage) },
              { path: 'forgot-password', ...page('forgotPassword', (m) => m.ForgotPasswordPage) },
              { path: 'reset-password', ...page('resetPassword', (m) => m.ResetPasswordPage) },
              { path: 'safety', ...page('safety', (m) => m.SafetyPage) },
              { path: 'planner', ...page('planner', (m) => m.PlannerPage) },
              { path: 'find', ...page('find', (m) => m.FindFiringPage, undefined, FIND_HEADING) },
              { path: 'my-ware', ...page('myWare', (m) => m.MyWarePage, ['potter']) },
              { path: 'kiln-room', ...page('kilnRoom', (m) => m.KilnRoomPage, studioSide) },
              { path: 'studios/:id', ...page('publicStudio', (m) => m.PublicStudioPage) },
              { path: 'studios/:id/edit', ...page('studioEditor', (m) => m.StudioEditorPage, studioSide) },
              { path: 'studios/:id/calendar', ...page('calendar', (m) => m.CalendarPage, studioSide) },
              { path: 'studios/:id/crew', ...page('crew', (m) => m.CrewPage, studioSide) },
              { path: 'studios/:id/money', ...page('money', (m) => m.MoneyPage, studioSide) },
              { path: 'studios/:id/kilns/new', ...page('kilnEditor', (m) => m.NewKilnPage, studioSide) },
              { path: 'studios/:id/requests', ...page('inbox', (m) => m.StudioInboxPage, studioSide) },
              { path: 'firings/:firingId/request', ...page('composeRequest', (m) => m.ComposeRequestPage, ['potter']) },
              { path: 'firings/:firingId/requests', ...page('inbox', (m) => m.FiringInboxPage, studioSide) },
              { path: 'firings/:firingId/log', ...page('firingLog', (m) => m.FiringLogPage, studioSide) },
              { path: 'firings/:firingId/load', ...page('load', (m) => m.LoadPage, studioSide) },
              { path: 'firings/:firingId/unload', ...page('unload', (m) => m.UnloadPage, studioSide) },
              { path: 'pieces/:tag', ...page('piece', (m) => m.PiecePage, ['potter', 'host', 'crew', 'admin']) },
              { path: 'requests/:id', ...page('request', (m) => m.RequestPage, ['potter', 'host', 'crew']) },
              { path: 'kilns/:id', ...page('kiln', (m) => m.KilnPage, studioSide) },
              { path: 'kilns/:id/edit', ...page('kilnEditor', (m) => m.KilnEditorPage, studioSide) },
              { path: 'join-studio', ...page('joinStudio', (m) => m.JoinStudioPage) },
              { path: 'front-desk', ...page('frontDesk', (m) => m.FrontDeskPage, ['admin']) },
              { path: 'front-desk/claims', ...page('deskClaims', (m) => m.DeskClaimsPage, ['admin']) },
              { path: 'incidents/:id', ...page('incident', (m) => m.IncidentPage, ['potter', 'host', 'crew', 'admin']) },
              {
                path: 'firings/:firingId/incidents/new',
                ...page('reportIncident', (m) => m.ReportIncidentPage, ['potter', 'host', 'crew']),
              },
              { path: 'studios/:id/incidents', ...page('incidentHistory', (m) => m.IncidentHistoryPage, studioSide) },
              { path: 'notices', ...page('notices', (m) => m.NoticesPage, ['potter', 'host', 'crew', 'admin']) },
              { path: '*', element: <NotFoundPage />, handle: { page: 'notFound' } satisfies PageHandle },
            ],
          },
        ],
      },
    ],
  },
]
