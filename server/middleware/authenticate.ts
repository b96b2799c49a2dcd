import { randomBytes, timingSafeEqual } from 'node:crypto'
import type { NextFunction, Request, Response } from 'express'
import type { DataSource } from 'typeorm'
import { UserEntity } from '../entities/user.entity'
import { HttpError } from '../errors/http-error'
import { authenticateTokenSecret } from '../services/tokens.service'

export interface AuthenticatedUser {
  id: number
  email: string
  displayName: string
}

export interface AuthInfo {
  via: 'session' | 'token'
  user: AuthenticatedUser
  /** The personal API token of a bearer request. */
  tokenId?: number
  /** Throws 403 `csrf` unless the request carries the session's CSRF token. */
  assertCsrf(req: Request): void
}

declare module 'express-session' {
  interface SessionData {
    userId?: number
    csrfToken?: string
  }
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      auth?: AuthInfo
    }
  }
}

export const CSRF_HEADER = 'x-csrf-token'

/** Last-active times are written at most this often per user (a write per request would be waste). */
const LAST_ACTIVE_RESOLUTION_MS = 60_000

export function newCsrfToken(): string {
  return randomBytes(24).toString('base64url')
}

function sameToken(a: string, b: string): boolean {
  const x = Buffer.from(a)
  const y = Buffer.from(b)
  return x.length === y.length && timingSafeEqual(x, y)
}

function assertSessionCsrf(req: Request): void {
  const expected = req.session?.csrfToken
  const given = req.get(CSRF_HEADER)
  if (!expected || !given || !sameToken(expected, given)) {
    throw new HttpError(
      403,
      'csrf',
      'This request is missing its CSRF token. Reload the page, or send the X-CSRF-Token header given by /api/v1/auth/me.',
    )
  }
}

/** `Authorization: Bearer <secret>`; the scheme name is case-insensitive (RFC 7235). */
const BEARER_PATTERN = /^Bearer +(\S+) *$/i

const invalidToken = () =>
  new HttpError(401, 'invalid_token', 'The Authorization header does not carry a valid API token: it is unknown, revoked or expired.')

/**
 * Attaches `req.auth` when the request carries a valid personal API token (bearer) or a
 * valid session cookie. An Authorization header that does not hold a working token is
 * answered 401 `invalid_token` and never falls through to the cookie.
 */
export function authenticate(ds: DataSource) {
  const users = ds.getRepository(UserEntity)
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization')
    if (header !== undefined) {
      const secret = BEARER_PATTERN.exec(header)?.[1]
      const found = secret === undefined ? undefined : await authenticateTokenSecret(ds, secret)
      if (!found) throw invalidToken()
      // A bearer request carries no cookie a third-party page could ride on: no CSRF check.
      req.auth = { via: 'token', tokenId: found.tokenId, user: found.user, assertCsrf: () => undefined }
      return next()
    }
    const userId = req.session?.userId
    if (userId !== undefined) {
      const user = await users.findOneBy({ id: userId })
      if (user) {
        req.auth = {
          via: 'session',
          user: { id: user.id, email: user.email, displayName: user.displayName },
          assertCsrf: assertSessionCsrf,
        }
        const now = Date.now()
        if (!user.lastActiveAt || now - user.lastActiveAt.getTime() > LAST_ACTIVE_RESOLUTION_MS) {
          await users.update({ id: user.id }, { lastActiveAt: new Date(now) })
        }
      } else {
        delete req.session.userId
      }
    }
    next()
  }
}
