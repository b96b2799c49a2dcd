import type { RequestHandler } from 'express'
import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { loginRequestSchema, sessionInfoSchema } from '../../shared/api/auth'
import { newCsrfToken } from '../middleware/authenticate'
import { sessionInfo, teamsOf, verifyCredentials } from '../services/auth.service'
import type { ApiRegistry } from './api-route'

function regenerate(req: Parameters<RequestHandler>[0]): Promise<void> {
  return new Promise((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())))
}
/** Signs `userId` in on a fresh session id (no session fixation); resolves to the session's CSRF token. */
export async function startSession(req: Parameters<RequestHandler>[0], userId: number): Promise<string> {
  await regenerate(req)
  req.session.userId = userId
  req.session.csrfToken = newCsrfToken()
  return req.session.csrfToken
}
function destroy(req: Parameters<RequestHandler>[0]): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())))
}

export function authRoutes(api: ApiRegistry, ds: DataSource, loginLimiter: RequestHandler): void {
  api.add({
    method: 'post',
    path: '/auth/login',
    tag: 'auth',
    summary: 'Sign in with e-mail and password',
    description:
      'Starts a cookie session. Repeated failures for one address from one client are answered 429 for a while.',
    access: 'public',
    body: loginRequestSchema,
    response: sessionInfoSchema,
    errors: [401, 429],
    middleware: [loginLimiter],
    activity: { none: 'Signing in starts a session and changes no work.' },
    handler: async ({ body, req }) => {
      const user = await verifyCredentials(ds, body.email, body.password)
      return sessionInfo(ds, user, await startSession(req, user.id))
    },
  })

  api.add({
    method: 'post',
    path: '/auth/logout',
    tag: 'auth',
    summary: 'Sign out of this session',
    access: { permission: 'signedIn', scope: 'none' },
    status: 204,
    activity: { none: 'Signing out ends a session and changes no work.' },
    handler: async ({ req, res }) => {
      await destroy(req)
      res.clearCookie('rootcast.sid', { path: '/' })
    },
  })

  api.add({
    method: 'get',
    path: '/auth/me',
    tag: 'auth',
    summary: 'The signed-in person, their teams and roles, and the CSRF token of the session',
    access: { permission: 'signedIn', scope: 'none' },
    response: sessionInfoSchema,
    handler: async ({ user, req }) => {
      if (req.auth?.via === 'session' && !req.session.csrfToken) req.session.csrfToken = newCsrfToken()
      return sessionInfo(ds, user, req.session?.csrfToken ?? '')
    },
  })

  api.add({
    method: 'get',
    path: '/teams',
    tag: 'teams',
    summary: 'The teams of the signed-in person, with their role in each',
    access: { permission: 'signedIn', scope: 'none' },
    response: z.array(sessionInfoSchema.shape.teams.element),
    handler: async ({ user }) => teamsOf(ds, user.id),
  })
}
