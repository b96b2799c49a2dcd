import { randomBytes, timingSafeEqual } from 'node:crypto'
import type { NextFunction, Request, Response } from 'express'
import type { DataSource } from 'typeorm'
import { UserEntity } from '../entities/user.entity'
import { HttpError } from '../errors/http-error'

export interface AuthenticatedUser {
  id: number
  email: string
  displayName: string
}

export interface AuthInfo {
  via: 'session' | 'token'
  user: AuthenticatedUser
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

/**
 * Attaches `req.auth` when the request carries a valid session cookie. A bearer header is
 * answered 401 until personal API tokens exist, so it can never fall through to a session.
 */
export function authenticate(ds: DataSource) {
  const users = ds.getRepository(UserEntity)
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization')
    if (header !== undefined) {
      throw new HttpError(401, 'invalid_token', 'The Authorization header does not carry a valid API token.')
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
