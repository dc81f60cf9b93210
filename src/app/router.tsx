import { createBrowserRouter } from 'react-router-dom'
import { ForgotPasswordPage } from '../features/auth/pages/ForgotPasswordPage'
import { RegisterPage } from '../features/auth/pages/RegisterPage'
import { ResetPasswordPage } from '../features/auth/pages/ResetPasswordPage'
import { SignInPage } from '../features/auth/pages/SignInPage'
import { VerifyEmailPage } from '../features/auth/pages/VerifyEmailPage'
import { FrontDeskPage } from '../features/home/pages/FrontDeskPage'
import { KilnRoomPage } from '../features/home/pages/KilnRoomPage'
import { LandingPage } from '../features/home/pages/LandingPage'
import { MyWarePage } from '../features/home/pages/MyWarePage'
import { SafetyPage } from '../features/home/pages/SafetyPage'
import { PlannerPage } from '../features/planner/pages/PlannerPage'
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
      { path: 'my-ware', element: <RequireRole roles={['potter']}><MyWarePage /></RequireRole> },
      { path: 'kiln-room', element: <RequireRole roles={['host', 'crew']}><KilnRoomPage /></RequireRole> },
      { path: 'front-desk', element: <RequireRole roles={['admin']}><FrontDeskPage /></RequireRole> },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
])
