import { createBrowserRouter } from 'react-router-dom'
import { ForgotPasswordPage } from '../features/auth/pages/ForgotPasswordPage'
import { RegisterPage } from '../features/auth/pages/RegisterPage'
import { ResetPasswordPage } from '../features/auth/pages/ResetPasswordPage'
import { SignInPage } from '../features/auth/pages/SignInPage'
import { VerifyEmailPage } from '../features/auth/pages/VerifyEmailPage'
import { FrontDeskPage } from '../features/admin/pages/FrontDeskPage'
import { LandingPage } from '../features/home/pages/LandingPage'
import { SafetyPage } from '../features/home/pages/SafetyPage'
import { PlannerPage } from '../features/planner/pages/PlannerPage'
import { ComposeRequestPage } from '../features/requests/pages/ComposeRequestPage'
import { MyWarePage } from '../features/requests/pages/MyWarePage'
import { RequestPage } from '../features/requests/pages/RequestPage'
import { FiringInboxPage, StudioInboxPage } from '../features/requests/pages/StudioInboxPage'
import { FindFiringPage } from '../features/search/pages/FindFiringPage'
import { NoticesPage } from '../features/notices/pages/NoticesPage'
import { CalendarPage } from '../features/studios/pages/CalendarPage'
import { CrewPage } from '../features/studios/pages/CrewPage'
import { FiringLogPage } from '../features/studios/pages/FiringLogPage'
import { JoinStudioPage } from '../features/studios/pages/JoinStudioPage'
import { KilnEditorPage, NewKilnPage } from '../features/studios/pages/KilnEditorPage'
import { KilnPage } from '../features/studios/pages/KilnPage'
import { KilnRoomPage } from '../features/studios/pages/KilnRoomPage'
import { MoneyPage } from '../features/studios/pages/MoneyPage'
import { PublicStudioPage } from '../features/studios/pages/PublicStudioPage'
import { StudioEditorPage } from '../features/studios/pages/StudioEditorPage'
import { ErrorPage, NotFoundPage } from './ErrorPage'
import { Layout } from './Layout'
import { RequireRole } from './RequireRole'

export const router = createBrowserRouter([
  {
    element: <Layout />,
    errorElement: <ErrorPage />,
    children: [
      { index: true, element: <LandingPage /> },
      { path: 'sign-in', element: <SignInPage /> },
      { path: 'join', element: <RegisterPage /> },
      { path: 'verify-email', element: <VerifyEmailPage /> },
      { path: 'forgot-password', element: <ForgotPasswordPage /> },
      { path: 'reset-password', element: <ResetPasswordPage /> },
      { path: 'safety', element: <SafetyPage /> },
      { path: 'planner', element: <PlannerPage /> },
      { path: 'find', element: <FindFiringPage /> },
      {
        path: 'my-ware',
        element: (
          <RequireRole roles={['potter']}>
            <MyWarePage />
          </RequireRole>
        ),
      },
      {
        path: 'kiln-room',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <KilnRoomPage />
          </RequireRole>
        ),
      },
      {
        path: 'notices',
        element: (
          <RequireRole roles={['potter', 'host', 'crew', 'admin']}>
            <NoticesPage />
          </RequireRole>
        ),
      },
      { path: 'studios/:id', element: <PublicStudioPage /> },
      {
        path: 'studios/:id/edit',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <StudioEditorPage />
          </RequireRole>
        ),
      },
      {
        path: 'studios/:id/calendar',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <CalendarPage />
          </RequireRole>
        ),
      },
      {
        path: 'studios/:id/crew',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <CrewPage />
          </RequireRole>
        ),
      },
      {
        path: 'studios/:id/money',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <MoneyPage />
          </RequireRole>
        ),
      },
      {
        path: 'studios/:id/kilns/new',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <NewKilnPage />
          </RequireRole>
        ),
      },
      {
        path: 'studios/:id/requests',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <StudioInboxPage />
          </RequireRole>
        ),
      },
      {
        path: 'firings/:firingId/request',
        element: (
          <RequireRole roles={['potter']}>
            <ComposeRequestPage />
          </RequireRole>
        ),
      },
      {
        path: 'firings/:firingId/requests',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <FiringInboxPage />
          </RequireRole>
        ),
      },
      {
        path: 'firings/:firingId/log',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <FiringLogPage />
          </RequireRole>
        ),
      },
      {
        path: 'requests/:id',
        element: (
          <RequireRole roles={['potter', 'host', 'crew']}>
            <RequestPage />
          </RequireRole>
        ),
      },
      {
        path: 'kilns/:id',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <KilnPage />
          </RequireRole>
        ),
      },
      {
        path: 'kilns/:id/edit',
        element: (
          <RequireRole roles={['host', 'crew']}>
            <KilnEditorPage />
          </RequireRole>
        ),
      },
      { path: 'join-studio', element: <JoinStudioPage /> },
      {
        path: 'front-desk',
        element: (
          <RequireRole roles={['admin']}>
            <FrontDeskPage />
          </RequireRole>
        ),
      },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
])
