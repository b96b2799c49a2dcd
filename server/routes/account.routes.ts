import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import type { DataSource } from 'typeorm'
import {
  changePasswordSchema,
  PASSWORD_RESET_ACCEPTED_MESSAGE,
  passwordResetAcceptedSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  revokedSessionsSchema,
  updateProfileSchema,
} from '../../shared/api/account'
import { sessionInfoSchema } from '../../shared/api/auth'
import { HttpError } from '../errors/http-error'
import * as account from '../services/account.service'
import { sessionInfo } from '../services/auth.service'
import type { Mailer } from '../services/mail.service'
import type { ApiRegistry } from './api-route'

const signedIn = { permission: 'signedIn', scope: 'none' } as const

export interface AccountRouteDeps {
  ds: DataSource
  publicUrl: string
  mailer?: Mailer
  /** Attempts per client and key within the window, as for sign-in. */
  limits: { maxFailures: number; windowMs: number }
}

/** One client asking about one key (an address, a person) too often: 429 `rate_limited`. */
function attemptLimiter(
  limits: AccountRouteDeps['limits'],
  opts: { key: (req: Request) => string; onlyFailures: boolean; message: string },
): RequestHandler {
  return rateLimit({
    windowMs: limits.windowMs,
    limit: limits.maxFailures,
    skipSuccessfulRequests: opts.onlyFailures,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${opts.key(req)}`,
    handler: (_req, _res, next) => next(new HttpError(429, 'rate_limited', opts.message)),
  })
}

/** The session id of a cookie session; a bearer token has none and is refused here. */
function sessionIdOf(req: Request): string {
  if (req.auth?.via !== 'session') {
    throw new HttpError(403, 'session_required', 'Passwords and sessions are managed from a signed-in browser session, not with a token.')
  }
  return req.sessionID
}

export function accountRoutes(api: ApiRegistry, deps: AccountRouteDeps): void {
  const { ds } = deps
  const passwordLimiter = attemptLimiter(deps.limits, {
    key: (req) => `user:${req.auth?.user.id ?? 'none'}`,
    onlyFailures: true,
    message: 'Too many wrong current passwords. Wait a few minutes and try again.',
  })
  const resetLimiter = attemptLimiter(deps.limits, {
    key: (req) => `reset:${String(req.body?.email ?? '').trim().toLowerCase()}`,
    onlyFailures: false,
    message: 'Too many reset requests for this address. Wait a few minutes and try again.',
  })

  api.add({
    method: 'patch', path: '/auth/me', tag: 'auth', summary: 'Change your display name',
    access: signedIn, body: updateProfileSchema, response: sessionInfoSchema,
    activity: { none: 'a person’s own account, not team work' },
    handler: async ({ user, body, req }) =>
      sessionInfo(ds, await account.updateDisplayName(ds, user.id, body.displayName), req.session?.csrfToken ?? ''),
  })

  api.add({
    method: 'post', path: '/auth/password', tag: 'auth', summary: 'Change your password; your other sessions are signed out',
    description:
      'Needs the current password (400 `wrong_password` otherwise; repeated failures from one client are answered 429 for a while) and a cookie session (403 `session_required` with a token). This session stays signed in.',
    access: signedIn, body: changePasswordSchema, status: 204, errors: [429], middleware: [passwordLimiter],
    activity: { none: 'a person’s own account, not team work' },
    handler: async ({ user, body, req }) => account.changePassword(ds, user.id, sessionIdOf(req), body),
  })

  api.add({
    method: 'post', path: '/auth/sessions/revoke-others', tag: 'auth', summary: 'Sign out all your other sessions',
    description: 'Needs a cookie session (403 `session_required` with a token); this session stays signed in.',
    access: signedIn, response: revokedSessionsSchema,
    activity: { none: 'a person’s own sessions, not team work' },
    handler: async ({ user, req }) => ({ revoked: await account.revokeOtherSessions(ds, user.id, sessionIdOf(req)) }),
  })

  api.add({
    method: 'post', path: '/auth/password-reset', tag: 'auth', summary: 'Ask for a password reset link by mail',
    description:
      'Always answers 202 with the same body, whether or not an account uses the address; when one does, a single-use link that works for 60 minutes is mailed to it. Repeated requests for one address from one client are answered 429 for a while.',
    access: 'public', body: passwordResetRequestSchema, status: 202, response: passwordResetAcceptedSchema, errors: [429],
    middleware: [resetLimiter],
    activity: { none: 'the log must not tell whether an address has an account' },
    handler: async ({ body }) => {
      const issued = await account.issuePasswordReset(ds, body.email)
      if (issued && deps.mailer) {
        const link = `${deps.publicUrl}/reset-password?token=${encodeURIComponent(issued.token)}`
        // Not awaited: the answer must not wait on the mail server, or its timing would tell.
        deps.mailer.send(account.composePasswordResetMail(issued.email, link)).catch((err: unknown) => {
          console.error('[rootcast] the password reset mail could not be sent:', err)
        })
      }
      return { message: PASSWORD_RESET_ACCEPTED_MESSAGE }
    },
  })

  api.add({
    method: 'post', path: '/auth/password-reset/confirm', tag: 'auth', summary: 'Set a new password with the token of a reset link',
    description: 'The token works once and for 60 minutes; unknown, used or expired tokens are 400 `invalid_token`. Every session of the person is signed out.',
    access: 'public', body: passwordResetConfirmSchema, status: 204,
    activity: { none: 'a person’s own account, not team work' },
    handler: async ({ body }) => account.confirmPasswordReset(ds, body.token, body.password),
  })
}
