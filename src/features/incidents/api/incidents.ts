import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query'
import type {
  ClaimJson,
  ClaimPayAnswer,
  FiringIncidentJson,
  IncidentJson,
  RemedyJson,
  StudioIncidentHistory,
} from '../../../../shared/api/incidents'
import type { PhotoJson } from '../../../../shared/api/photos'
import type { ClaimBody, ClaimDecisionBody, ClaimPayBody, IncidentBody, RemedyBody } from '../../../../shared/schemas/incidents'
import { api } from '../../../lib/api'
import { keys } from '../../../lib/queryKeys'

/** One incident; `awaitingPayment` reads it again every few seconds until the webhook has marked its claim paid. */
export function useIncident(id: string, awaitingPayment = false) {
  return useQuery({
    queryKey: keys.incidents.detail(id),
    queryFn: () => api<IncidentJson>(`/api/incidents/${id}`),
    refetchInterval: (query) =>
      awaitingPayment && query.state.data?.claims.some((c) => c.status !== 'paid' && c.actions.includes('pay')) ? 2000 : false,
  })
}

export function useFiringIncidents(firingId: string) {
  return useQuery({
    queryKey: keys.incidents.ofFiring(firingId),
    queryFn: () => api<{ incidents: FiringIncidentJson[] }>(`/api/firings/${firingId}/incidents`),
  })
}

export function useStudioIncidents(studioId: string) {
  return useQuery({
    queryKey: keys.incidents.ofStudio(studioId),
    queryFn: () => api<StudioIncidentHistory>(`/api/studios/${studioId}/incidents`),
  })
}

export function useDeskClaims() {
  return useQuery({ queryKey: keys.incidents.desk(), queryFn: () => api<{ claims: ClaimJson[] }>('/api/admin/claims') })
}

/** Reports the incident, then sends its photos; the incident page opens once both are in. */
export function useReportIncident(firingId: string) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: async ({ body, photos }: { body: Partial<IncidentBody>; photos: File[] }) => {
      const incident = await api<IncidentJson>(`/api/firings/${firingId}/incidents`, { method: 'POST', body })
      if (photos.length) {
        const form = new FormData()
        for (const photo of photos) form.append('photos', photo)
        await api<{ photos: PhotoJson[] }>(`/api/incidents/${incident.id}/photos`, { method: 'POST', body: form })
      }
      return incident
    },
    onSuccess: (incident) => {
      void client.invalidateQueries({ queryKey: keys.incidents.all })
      void client.invalidateQueries({ queryKey: keys.requests.detail(incident.requestId) })
    },
  })
}

function useIncidentChange<T, V>(incidentId: string, requestId: string | undefined, mutationFn: (vars: V) => Promise<T>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn,
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: keys.incidents.all })
      if (requestId) void client.invalidateQueries({ queryKey: keys.requests.detail(requestId) })
    },
  })
}

export function useRaiseClaim(incident: Pick<IncidentJson, 'id' | 'requestId'>) {
  // An amount the form could not read is left out, and the server names it by the field.
  return useIncidentChange(incident.id, incident.requestId, (body: Omit<ClaimBody, 'amountCents'> & { amountCents?: number }) =>
    api<ClaimJson>(`/api/incidents/${incident.id}/claims`, { method: 'POST', body }),
  )
}

export function usePayClaim(incident: Pick<IncidentJson, 'id' | 'requestId'>) {
  return useIncidentChange(incident.id, incident.requestId, ({ claimId, with: how }: { claimId: string; with: ClaimPayBody['with'] }) =>
    api<ClaimPayAnswer>(`/api/claims/${claimId}/accept`, { method: 'POST', body: { with: how } }),
  )
}

export function useContestClaim(incident: Pick<IncidentJson, 'id' | 'requestId'>) {
  return useIncidentChange(incident.id, incident.requestId, ({ claimId, reason }: { claimId: string; reason: string }) =>
    api<ClaimJson>(`/api/claims/${claimId}/contest`, { method: 'POST', body: { reason } }),
  )
}

export function useDecideClaim() {
  return useIncidentChange('', undefined, ({ claimId, body }: { claimId: string; body: ClaimDecisionBody }) =>
    api<ClaimJson>(`/api/admin/claims/${claimId}/decide`, { method: 'POST', body }),
  )
}

/**
 * The studio's owner makes good to one hurt potter: the incident, that potter's ask (its timeline and
 * money), the ask lists and the studio's money page change with it.
 */
export function useMakeGood(incident: Pick<IncidentJson, 'id' | 'studioId'>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: (body: Partial<RemedyBody>) => api<RemedyJson>(`/api/incidents/${incident.id}/remedies`, { method: 'POST', body }),
    onSuccess: (remedy) => {
      void client.invalidateQueries({ queryKey: keys.incidents.all })
      void client.invalidateQueries({ queryKey: keys.requests.detail(remedy.requestId) })
      void client.invalidateQueries({ queryKey: keys.requests.lists() })
      void client.invalidateQueries({ queryKey: keys.studios.payouts(incident.studioId) })
    },
  })
}
