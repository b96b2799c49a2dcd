import { sessionInfoSchema, type LoginRequest, type SessionInfo } from '../../shared/api'
import { ApiRequestError, request, setCsrfToken } from './http'

/** The signed-in session, or null when nobody is signed in (401). */
export async function getSession(): Promise<SessionInfo | null> {
  try {
    const session = await request('/auth/me', { schema: sessionInfoSchema, reportUnauthenticated: false })
    setCsrfToken(session.csrfToken)
    return session
  } catch (error) {
    if (error instanceof ApiRequestError && error.status === 401) {
      setCsrfToken(null)
      return null
    }
    throw error
  }
}

/** Signs in with e-mail and password; the server sets the session cookie. */
export async function login(credentials: LoginRequest): Promise<SessionInfo> {
  const session = await request('/auth/login', {
    method: 'POST',
    body: credentials,
    schema: sessionInfoSchema,
    withCsrf: false,
    reportUnauthenticated: false,
  })
  setCsrfToken(session.csrfToken)
  return session
}

/** Ends the session on the server. The local token is dropped even when the call fails. */
export async function logout(): Promise<void> {
  try {
    await request('/auth/logout', { method: 'POST', reportUnauthenticated: false })
  } finally {
    setCsrfToken(null)
  }
}
