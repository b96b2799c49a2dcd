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
    handler: async ({ body, req }) => {
      const user = await verifyCredentials(ds, body.email, body.password)
      await regenerate(req) // a fresh session id at sign-in: no session fixation
      req.session.userId = user.id
      req.session.csrfToken = newCsrfToken()
      return sessionInfo(ds, user, req.session.csrfToken)
    },
  })

  api.add({
    method: 'post',
    path: '/auth/logout',
    tag: 'auth',
    summary: 'Sign out of this session',
    access: { permission: 'signedIn', scope: 'none' },
    status: 204,
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
