/**
 * A browser-like HTTP session for integration tests: keeps cookies, fetches and sends the CSRF token
 * on changes, and returns status, headers and parsed body without throwing on 4xx.
 */
export interface Reply<T = any> {
  status: number
  body: T
  headers: Headers
  setCookies: string[]
}

export class HttpSession {
  readonly cookies = new Map<string, string>()
  csrfToken: string | null = null

  constructor(readonly baseUrl: string) {}

  private storeCookies(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair, ...attrs] = line.split(';')
      const eq = pair.indexOf('=')
      const name = pair.slice(0, eq).trim()
      const value = pair.slice(eq + 1).trim()
      const expired = attrs.some((a) => /^\s*expires=/i.test(a) && new Date(a.split('=')[1]).getTime() < Date.now())
      if (expired || value === '') this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
  }

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  async fetchCsrf(): Promise<string> {
    const reply = await this.request('GET', '/api/auth/csrf')
    this.csrfToken = reply.body.token
    return this.csrfToken!
  }

  async request<T = any>(
    method: string,
    path: string,
    body?: unknown,
    options: { csrf?: boolean; headers?: Record<string, string>; raw?: string | Uint8Array<ArrayBuffer> | FormData } = {},
  ): Promise<Reply<T>> {
    const headers: Record<string, string> = { Accept: 'application/json' }
    // Fetching the token may start the session, so it comes before the cookie header is written.
    if (method !== 'GET' && options.csrf !== false) headers['X-CSRF-Token'] = this.csrfToken ?? (await this.fetchCsrf())
    Object.assign(headers, options.headers)
    if (this.cookies.size) headers.Cookie = this.cookieHeader()
    if (body !== undefined) headers['Content-Type'] = 'application/json'
    const res = await fetch(this.baseUrl + path, {
      method,
      headers,
      body: options.raw ?? (body === undefined ? undefined : JSON.stringify(body)),
      redirect: 'manual',
    })
    this.storeCookies(res)
    // These regenerate the session, and with it the token, as the browser client also assumes.
    if (/^\/api\/auth\/(login|register|logout)$/.test(path)) this.csrfToken = null
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : undefined
    } catch {
      // not JSON: leave the text
    }
    return { status: res.status, body: parsed as T, headers: res.headers, setCookies: res.headers.getSetCookie() }
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path)
  }
  post<T = any>(path: string, body?: unknown, options?: Parameters<HttpSession['request']>[3]) {
    return this.request<T>('POST', path, body, options)
  }
  put<T = any>(path: string, body?: unknown) {
    return this.request<T>('PUT', path, body)
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, body)
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path)
  }

  /** Signs in; the session regenerates, so the next change fetches a fresh CSRF token. */
  async signIn(email: string, password: string) {
    return this.post('/api/auth/login', { email, password })
  }
}
