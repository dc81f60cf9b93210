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

/** An error body (`{error:{code,message,fields}}`, or anything else) as the ApiError the pages read. */
function apiErrorOf(status: number, data: unknown): ApiError {
  const error = (data as { error?: { code?: string; message?: string; fields?: FieldErrors } } | undefined)?.error
  return new ApiError(
    status,
    error?.code ?? 'http-' + status,
    error?.message ?? `The server answered ${status}.`,
    error?.fields ?? {},
    (error ?? {}) as Record<string, unknown>,
  )
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
    const peek = (await res
      .clone()
      .json()
      .catch(() => null)) as { error?: { code?: string } } | null
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
  if (!res.ok) throw apiErrorOf(res.status, data)
  return data as T
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text)
  } catch {
    return undefined
  }
}

export interface UploadOptions {
  /** Called as the body goes out, with the share sent so far (0 to 1). */
  onProgress?: (share: number) => void
  signal?: AbortSignal
}

function postWithProgress(
  path: string,
  form: FormData,
  token: string,
  { onProgress, signal }: UploadOptions,
): Promise<{ status: number; data: unknown }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', path)
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.setRequestHeader('X-CSRF-Token', token)
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total)
    }
    xhr.onload = () => resolve({ status: xhr.status, data: xhr.responseText ? safeJson(xhr.responseText) : undefined })
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'Could not reach Conewright. Check your connection and try again.'))
    xhr.onabort = () => reject(new DOMException('The upload was stopped.', 'AbortError'))
    if (signal?.aborted) return reject(new DOMException('The upload was stopped.', 'AbortError'))
    signal?.addEventListener('abort', () => xhr.abort(), { once: true })
    xhr.send(form)
  })
}

/**
 * A multipart POST that reports how much has gone out. fetch cannot report an upload's progress, so
 * this one goes through XMLHttpRequest, with the same CSRF token, retry and error shape as `api`.
 */
export async function uploadWithProgress<T>(path: string, form: FormData, options: UploadOptions = {}): Promise<T> {
  let reply = await postWithProgress(path, form, csrfToken ?? (await fetchCsrfToken()), options)
  if (reply.status === 403 && (reply.data as { error?: { code?: string } } | undefined)?.error?.code === 'csrf-invalid') {
    options.onProgress?.(0)
    reply = await postWithProgress(path, form, await fetchCsrfToken(), options)
  }
  if (reply.status < 200 || reply.status >= 300) throw apiErrorOf(reply.status, reply.data)
  return reply.data as T
}
