import type { NextFunction, Request, Response } from 'express'
import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { idParam } from '../../shared/api/common'
import { createdTokenSchema, newTokenSchema, tokenListSchema } from '../../shared/api/tokens'
import { ApiTokenEntity } from '../entities/api-token.entity'
import { HttpError } from '../errors/http-error'
import * as tokens from '../services/tokens.service'
import type { ApiRegistry } from './api-route'
import { quoted } from './activity-text'

const signedIn = { permission: 'signedIn', scope: 'none' } as const

/** A token must not mint or revoke tokens: a leaked one could otherwise keep itself alive. */
function requireSession(req: Request, _res: Response, next: NextFunction): void {
  if (req.auth?.via === 'token') {
    throw new HttpError(403, 'session_required', 'Tokens are created and revoked from a signed-in browser session, not with a token.')
  }
  next()
}

export function tokenRoutes(api: ApiRegistry, ds: DataSource): void {
  api.add({
    method: 'get', path: '/tokens', tag: 'tokens', summary: 'Your personal API tokens, newest first, without their secrets',
    access: signedIn, response: tokenListSchema,
    handler: async ({ user }) => ({ items: await tokens.listTokens(ds, user.id) }),
  })

  api.add({
    method: 'post', path: '/tokens', tag: 'tokens', summary: 'Create a personal API token; the answer is the only time its secret is shown',
    description: 'Needs a cookie session: a request made with a token is answered 403 `session_required`. The server keeps only a SHA-256 hash of the secret.',
    access: signedIn, body: newTokenSchema, status: 201, response: createdTokenSchema, middleware: [requireSession],
    handler: async ({ user, body }) => tokens.createToken(ds, user.id, body),
    // Personal: the entry belongs to no team and shows in no team's log.
    activity: ({ result }) => ({ action: 'created', targetType: 'token', targetId: result.id, targetName: result.name, summary: `Created API token ${quoted(result.name)} (${result.prefix}…).` }),
  })

  api.add({
    method: 'delete', path: '/tokens/:tokenId', tag: 'tokens', summary: 'Revoke one of your tokens; it is refused from then on',
    description: 'Needs a cookie session (403 `session_required` with a token). Another person’s token is 404.',
    access: signedIn, params: z.object({ tokenId: idParam }), status: 204, errors: [404], middleware: [requireSession],
    handler: async ({ user, params }) => tokens.revokeToken(ds, user.id, params.tokenId),
    activity: async ({ params }) => {
      // Revoking keeps the row, so its name can be read afterwards.
      const name = (await ds.getRepository(ApiTokenEntity).findOneBy({ id: params.tokenId }))?.name ?? `#${params.tokenId}`
      return { action: 'revoked', targetType: 'token', targetId: params.tokenId, targetName: name, summary: `Revoked API token ${quoted(name)}.` }
    },
  })
}
