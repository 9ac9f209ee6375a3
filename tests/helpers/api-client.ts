// A small HTTP client with a cookie jar, so tests talk to the real server as a browser would.
import { inject } from 'vitest'

export interface ApiResponse<T = unknown> {
  status: number
  headers: Headers
  body: T
}

export interface RequestOptions {
  body?: unknown
  headers?: Record<string, string>
}

export class ApiClient {
  cookie = ''

  constructor(readonly baseURL: string = inject('baseURL')) {}

  async request<T = any>(method: string, path: string, options: RequestOptions = {}): Promise<ApiResponse<T>> {
    const headers: Record<string, string> = { accept: 'application/json', ...options.headers }
    if (this.cookie) headers.cookie = this.cookie
    if (options.body !== undefined) headers['content-type'] = 'application/json'
    const response = await fetch(`${this.baseURL}${path}`, {
      method,
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      redirect: 'manual',
    })
    this.keepCookies(response.headers)
    const text = await response.text()
    let body: unknown = text
    try { body = text ? JSON.parse(text) : null } catch { /* not JSON */ }
    return { status: response.status, headers: response.headers, body: body as T }
  }

  get<T = any>(path: string, options?: RequestOptions) { return this.request<T>('GET', path, options) }
  post<T = any>(path: string, body?: unknown, options: RequestOptions = {}) { return this.request<T>('POST', path, { ...options, body }) }
  patch<T = any>(path: string, body?: unknown, options: RequestOptions = {}) { return this.request<T>('PATCH', path, { ...options, body }) }
  put<T = any>(path: string, body?: unknown, options: RequestOptions = {}) { return this.request<T>('PUT', path, { ...options, body }) }
  delete<T = any>(path: string, options?: RequestOptions) { return this.request<T>('DELETE', path, options) }

  async signIn(email: string, password = 'cuspline-demo'): Promise<ApiResponse> {
    const response = await this.post('/api/auth/login', { email, password })
    if (response.status !== 200) throw new Error(`sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`)
    return response
  }

  private keepCookies(headers: Headers): void {
    for (const line of headers.getSetCookie()) {
      const [pair] = line.split(';')
      const [name] = pair!.split('=')
      const others = this.cookie.split('; ').filter((entry) => entry && !entry.startsWith(`${name}=`))
      const cleared = /max-age=0|expires=thu, 01 jan 1970/i.test(line) || pair!.endsWith('=')
      this.cookie = [...others, ...(cleared ? [] : [pair!])].join('; ')
    }
  }
}

/** A client already signed in as one of the demo accounts. */
export async function signedInAs(email: string): Promise<ApiClient> {
  const client = new ApiClient()
  await client.signIn(email)
  return client
}
