import { afterEach, beforeEach, vi } from 'vitest'
import type { SessionInfo } from '../../shared/api'
import { setCsrfToken, setUnauthenticatedHandler } from '../../src/api/http'

/** One request as the client sent it to the stubbed fetch. */
export interface RecordedCall {
  method: string
  /** Path and query, e.g. `/api/v1/teams/3/projects?page=2`. */
  url: string
  pathname: string
  query: URLSearchParams
  /** Header names in lower case. */
  headers: Record<string, string>
  body: unknown
  /** A multipart body (uploads), as sent. */
  form: FormData | undefined
  credentials: RequestCredentials | undefined
}

/** Answer to one request: a Response, or an Error that fetch rejects with (network failure). */
export type StubHandler = (call: RecordedCall) => Response | Error | Promise<Response | Error>

export function jsonResponse(status: number, body: unknown, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json', ...headers },
  })
}

export function errorResponse(status: number, code: string, message: string, headers: Record<string, string> = {}) {
  return jsonResponse(status, { error: { code, message } }, headers)
}

export function noContent(): Response {
  return new Response(null, { status: 204 })
}

/**
 * Replaces global fetch (client unit tests only) with routes keyed "METHOD /pathname".
 * A request without a route is answered 501 with a message naming it, so it shows up in
 * the error the code under test reports, and `calls` keeps every request for assertions.
 */
export function stubFetch(routes: Record<string, StubHandler>) {
  const calls: RecordedCall[] = []
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string, init: RequestInit = {}) => {
      const parsed = new URL(input, 'http://127.0.0.1')
      const headers: Record<string, string> = {}
      new Headers(init.headers).forEach((value, key) => {
        headers[key.toLowerCase()] = value
      })
      const call: RecordedCall = {
        method: init.method ?? 'GET',
        url: `${parsed.pathname}${parsed.search}`,
        pathname: parsed.pathname,
        query: parsed.searchParams,
        headers,
        body: typeof init.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined,
        form: init.body instanceof FormData ? init.body : undefined,
        credentials: init.credentials,
      }
      calls.push(call)
      const handler = routes[`${call.method} ${call.pathname}`]
      const answer = handler
        ? await handler(call)
        : errorResponse(501, 'unexpected_request', `The test stub has no route for ${call.method} ${call.pathname}.`)
      if (answer instanceof Error) throw answer
      return answer
    }),
  )
  return { calls }
}

/** An invented session: two teams with different roles, so the team choice matters. */
export function sessionFixture(overrides: Partial<SessionInfo> = {}): SessionInfo {
  return {
    user: { id: 7, email: 'ines.ortega@harbour.test', displayName: 'Ines Ortega' },
    teams: [
      { id: 3, name: 'Harbour Type Workshop', role: 'editor' },
      { id: 11, name: 'Signage Lab', role: 'viewer' },
    ],
    csrfToken: 'csrf-7f3a9c',
    ...overrides,
  }
}

// happy-dom has no visualViewport, and Vuetify's overlays read it as a bare global
// (`visualViewport?.x`), which throws when it is not declared at all. Declared once, as absent.
if (!('visualViewport' in globalThis)) {
  Object.defineProperty(globalThis, 'visualViewport', { value: undefined, configurable: true, writable: true })
}

/**
 * Registers hooks that give every test of the calling file a clean page: empty
 * localStorage, no CSRF token or 401 handler left in the API module, globals unstubbed.
 */
export function isolateClientState(): void {
  beforeEach(() => {
    localStorage.clear()
    setCsrfToken(null)
    setUnauthenticatedHandler(null)
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })
}
