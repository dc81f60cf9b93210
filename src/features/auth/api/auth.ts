import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type { LoginBody, PublicUser, RegisterBody } from '../../../../shared/schemas/auth'
import { api, ApiError, resetCsrfToken } from '../../../lib/api'

export const authKeys = {
  me: ['auth', 'me'] as const,
}

/** The signed-in user, or null for a visitor. */
export async function fetchMe(): Promise<PublicUser | null> {
  try {
    return await api<PublicUser>('/api/auth/me')
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null
    throw error
  }
}

export function useMe() {
  return useQuery({ queryKey: authKeys.me, queryFn: fetchMe, staleTime: 60_000 })
}

function useSessionChange<TBody>(request: (body: TBody) => Promise<PublicUser | null>) {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: request,
    onSuccess: (user) => {
      // The session was regenerated: the old CSRF token and every cached answer belong to the old one.
      resetCsrfToken()
      queryClient.clear()
      queryClient.setQueryData(authKeys.me, user)
    },
  })
}

export function useSignIn() {
  return useSessionChange((body: LoginBody) => api<PublicUser>('/api/auth/login', { method: 'POST', body }))
}

export function useRegister() {
  return useSessionChange((body: RegisterBody) => api<PublicUser>('/api/auth/register', { method: 'POST', body }))
}

export function useSignOut() {
  return useSessionChange(async () => {
    await api('/api/auth/logout', { method: 'POST' })
    return null
  })
}

/** Asks for a one-time sign-in link, the way in while password sign-in is paused. */
export function useRequestSignInLink() {
  return useMutation({ mutationFn: (body: { email: string }) => api('/api/auth/sign-in-link', { method: 'POST', body }) })
}

export function useSignInWithLink() {
  return useSessionChange((token: string) => api<PublicUser>('/api/auth/sign-in-link/confirm', { method: 'POST', body: { token } }))
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: (body: { email: string }) => api('/api/auth/password-reset/request', { method: 'POST', body }) })
}

export function useConfirmPasswordReset() {
  return useMutation({
    mutationFn: (body: { token: string; password: string }) => api('/api/auth/password-reset/confirm', { method: 'POST', body }),
  })
}

export function useVerifyEmail() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (token: string) => api('/api/auth/verify-email', { method: 'POST', body: { token } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.me }),
  })
}

export function useResendVerification() {
  return useMutation({ mutationFn: () => api('/api/auth/verify-email/resend', { method: 'POST' }) })
}

export function useUpdatePreferences() {
  const queryClient = useQueryClient()
  return useMutation({
    mutationFn: (body: { unitSystem?: 'imperial' | 'metric'; displayName?: string }) =>
      api<PublicUser>('/api/auth/me', { method: 'PATCH', body }),
    onSuccess: (user) => queryClient.setQueryData(authKeys.me, user),
  })
}
