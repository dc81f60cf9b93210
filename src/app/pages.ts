// Every page but the landing page is its own chunk, loaded when its route is first opened (or
// prefetched, see prefetch.ts). The router and the prefetcher both load pages through this table,
// so a page is named once.

export const pages = {
  signIn: () => import('../features/auth/pages/SignInPage'),
  register: () => import('../features/auth/pages/RegisterPage'),
  verifyEmail: () => import('../features/auth/pages/VerifyEmailPage'),
  forgotPassword: () => import('../features/auth/pages/ForgotPasswordPage'),
  resetPassword: () => import('../features/auth/pages/ResetPasswordPage'),
  safety: () => import('../features/home/pages/SafetyPage'),
  planner: () => import('../features/planner/pages/PlannerPage'),
  find: () => import('../features/search/pages/FindFiringPage'),
  myWare: () => import('../features/requests/pages/MyWarePage'),
  composeRequest: () => import('../features/requests/pages/ComposeRequestPage'),
  request: () => import('../features/requests/pages/RequestPage'),
  inbox: () => import('../features/requests/pages/StudioInboxPage'),
  kilnRoom: () => import('../features/studios/pages/KilnRoomPage'),
  publicStudio: () => import('../features/studios/pages/PublicStudioPage'),
  studioEditor: () => import('../features/studios/pages/StudioEditorPage'),
  calendar: () => import('../features/studios/pages/CalendarPage'),
  crew: () => import('../features/studios/pages/CrewPage'),
  money: () => import('../features/studios/pages/MoneyPage'),
  firingLog: () => import('../features/studios/pages/FiringLogPage'),
  kilnEditor: () => import('../features/studios/pages/KilnEditorPage'),
  kiln: () => import('../features/studios/pages/KilnPage'),
  joinStudio: () => import('../features/studios/pages/JoinStudioPage'),
  frontDesk: () => import('../features/admin/pages/FrontDeskPage'),
  notices: () => import('../features/notices/pages/NoticesPage'),
  piece: () => import('../features/load/pages/PiecePage'),
  load: () => import('../features/load/pages/LoadPage'),
  unload: () => import('../features/load/pages/UnloadPage'),
  incident: () => import('../features/incidents/pages/IncidentPage'),
  reportIncident: () => import('../features/incidents/pages/ReportIncidentPage'),
  incidentHistory: () => import('../features/incidents/pages/IncidentHistoryPage'),
  deskClaims: () => import('../features/incidents/pages/DeskClaimsPage'),
}

export type PageName = keyof typeof pages | 'landing' | 'notFound'

/**
 * Where people most often go next from each page: loaded while the browser is idle, so the next
 * tap opens at once. Kept short, since on a slow link every prefetch shares the line.
 */
export const nextLikely: Partial<Record<PageName, (keyof typeof pages)[]>> = {
  landing: ['find', 'register'],
  find: ['publicStudio', 'composeRequest'],
  publicStudio: ['composeRequest'],
  composeRequest: ['request'],
  signIn: ['myWare', 'kilnRoom'],
  register: ['verifyEmail'],
  myWare: ['request', 'find'],
  request: ['myWare'],
  kilnRoom: ['inbox', 'calendar'],
  inbox: ['request', 'load'],
  load: ['unload', 'piece'],
  unload: ['piece'],
  calendar: ['firingLog'],
}
