/* eslint-disable @typescript-eslint/no-explicit-any -- test client: tests assert response bodies field by field, so bodies default to `any` */
/**
 * A tiny HTTP client for API tests that keeps cookies like a browser would
 * (the sealed session cookie of nuxt-auth-utils).
 */
export interface ApiResponse<T = any> { status: number, body: T, headers: Headers }

/** True for "the kept-alive connection was closed under us" (undici), not for an answer. */
function closedIdleConnection(error: unknown): boolean {
  const cause = (error as { cause?: { code?: unknown } } | undefined)?.cause
  return error instanceof TypeError && (cause?.code === 'UND_ERR_SOCKET' || cause?.code === 'ECONNRESET')
}

/**
 * fetch, sent once more when the server had already closed the idle kept-alive connection the
 * request went out on (a race when the test process was busy computing past the connection's
 * idle time): the server never read that request, so sending it again cannot repeat a write.
 */
async function fetchOnFreshSocketIfClosed(url: URL, init: RequestInit): Promise<Response> {
  try {
    return await fetch(url, init)
  } catch (error) {
    if (!closedIdleConnection(error) || init.body instanceof ReadableStream) throw error
    return await fetch(url, init)
  }
}

export class ApiClient {
  private cookies = new Map<string, string>()
  constructor(readonly baseUrl: string, readonly defaultHeaders: Record<string, string> = {}) {}

  /** Sends a request; `body` objects are sent as JSON, strings and FormData as they are. */
  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    const init: RequestInit = { method, headers: { ...this.defaultHeaders, ...headers }, redirect: 'manual' }
    const allHeaders = init.headers as Record<string, string>
    if (body !== undefined) {
      if (typeof body === 'string' || body instanceof FormData || body instanceof Uint8Array) init.body = body as BodyInit
      else {
        init.body = JSON.stringify(body)
        allHeaders['content-type'] ??= 'application/json'
      }
    }
    if (this.cookies.size) allHeaders.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const response = await fetchOnFreshSocketIfClosed(new URL(path, this.baseUrl), init)
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const index = pair!.indexOf('=')
      const name = pair!.slice(0, index).trim()
      const value = pair!.slice(index + 1).trim()
      if (!value || /max-age=0/i.test(line) || /expires=Thu, 01 Jan 1970/i.test(line)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await response.text()
    let parsed: unknown = text
    if ((response.headers.get('content-type') ?? '').includes('json') && text) {
      try {
        parsed = JSON.parse(text)
      } catch { /* leave as text */ }
    }
    return { status: response.status, body: parsed as T, headers: response.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  put<T = any>(path: string, body?: unknown) { return this.request<T>('PUT', path, body ?? {}) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  /** The cookie header value this client would send (for handing a session to a browser). */
  get cookieHeader(): string { return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ') }
  get hasSession(): boolean { return this.cookies.size > 0 }
}
