// The one way the client talks to the API: JSON in and out, the CSRF token on every change, and
// error bodies turned into ApiError with the server's field messages.

export type FieldErrors = Record<string, string>

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldErrors = {},
    readonly body: Record<string, unknown> = {},
  ) {
    super(message)
  }
}

let csrfToken: string | null = null

async function fetchCsrfToken(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' })
  if (!res.ok) throw new ApiError(res.status, 'csrf-unavailable', 'Could not reach Conewright. Check your connection.')
  csrfToken = ((await res.json()) as { token: string }).token
  return csrfToken
}

/** Forget the token: the session changed (sign-in, sign-out), so the server issues a new one. */
export function resetCsrfToken() {
  csrfToken = null
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'
  body?: unknown
  signal?: AbortSignal
}

async function send(path: string, { method = 'GET', body, signal }: RequestOptions, retried: boolean): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  const isForm = body instanceof FormData
  if (body !== undefined && !isForm) headers['Content-Type'] = 'application/json'
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrfToken())
  let res: Response
  try {
    res = await fetch(path, {
      method,
      headers,
      body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    })
  } catch (error) {
    if ((error as Error).name === 'AbortError') throw error
    throw new ApiError(0, 'offline', 'Could not reach Conewright. Check your connection and try again.')
  }
  if (res.status === 403 && !retried && method !== 'GET') {
    const peek = (await res.clone().json().catch(() => null)) as { error?: { code?: string } } | null
    if (peek?.error?.code === 'csrf-invalid') {
      await fetchCsrfToken()
      return send(path, { method, body, signal }, true)
    }
  }
  return res
}

export async function api<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const res = await send(path, options, false)
  if (res.status === 204) return undefined as T
  const text = await res.text()
  const data = text ? safeJson(text) : undefined
  if (!res.ok) {
    const error = (data as { error?: { code?: string; message?: string; fields?: FieldErrors } } | undefined)?.error
    throw new ApiError(
      res.status,
      error?.code ?? 'http-' + res.status,
      error?.message ?? `The server answered ${res.status}.`,
      error?.fields ?? {},
      (error ?? {}) as Record<string, unknown>,
    )
  }
  return data as T
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text)
  } catch {
    return undefined
  }
}
