import { createHash, randomBytes } from 'node:crypto'
import type { DataSource } from 'typeorm'
import { IsNull } from 'typeorm'
import { TOKEN_LIMITS, TOKEN_SECRET_PREFIX, type CreatedToken, type Token } from '../../shared/api/tokens'
import { ApiTokenEntity } from '../entities/api-token.entity'
import { UserEntity } from '../entities/user.entity'
import { notFound } from '../errors/http-error'
import type { AuthenticatedUser } from '../middleware/authenticate'

/** Random bytes in a secret: 256 bits, beyond any guessing. */
const SECRET_BYTES = 32
const DAY_MS = 86_400_000
/** A token's last use is written at most this often (a write per pipeline request would be waste). */
export const TOKEN_LAST_USED_RESOLUTION_MS = 60_000

/**
 * The stored form of a secret. A fast unsalted hash suits a 256-bit random secret: there is
 * no dictionary to try, so a slow password hash would only slow every request (common practice).
 */
export function hashTokenSecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex')
}

function toToken(row: ApiTokenEntity): Token {
  return {
    id: row.id,
    name: row.name,
    prefix: row.prefix,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    lastUsedAt: row.lastUsedAt?.toISOString() ?? null,
    revokedAt: row.revokedAt?.toISOString() ?? null,
  }
}

/** The person's own tokens, newest first, revoked and expired ones included. */
export async function listTokens(ds: DataSource, userId: number): Promise<Token[]> {
  const rows = await ds.getRepository(ApiTokenEntity).find({ where: { userId }, order: { createdAt: 'DESC', id: 'DESC' } })
  return rows.map(toToken)
}

/** Makes a token; the answer is the only place the secret ever appears. */
export async function createToken(ds: DataSource, userId: number, input: { name: string; expiresInDays: number }): Promise<CreatedToken> {
  const secret = TOKEN_SECRET_PREFIX + randomBytes(SECRET_BYTES).toString('base64url')
  const row = await ds.transaction(async (m) => {
    const repo = m.getRepository(ApiTokenEntity)
    const saved = await repo.save(
      repo.create({
        userId,
        name: input.name,
        tokenHash: hashTokenSecret(secret),
        prefix: secret.slice(0, TOKEN_LIMITS.prefixChars),
        expiresAt: new Date(Date.now() + input.expiresInDays * DAY_MS),
        lastUsedAt: null,
        revokedAt: null,
      }),
    )
    return repo.findOneByOrFail({ id: saved.id })
  })
  return { ...toToken(row), secret }
}

/** Revokes one of the person's tokens (again is a no-op); someone else's is 404. */
export async function revokeToken(ds: DataSource, userId: number, tokenId: number): Promise<void> {
  await ds.transaction(async (m) => {
    const repo = m.getRepository(ApiTokenEntity)
    const row = await repo.findOne({ where: { id: tokenId, userId }, lock: { mode: 'pessimistic_write' } })
    if (!row) throw notFound('That token')
    if (row.revokedAt === null) await repo.update({ id: tokenId, revokedAt: IsNull() }, { revokedAt: new Date() })
  })
}

/**
 * The person a bearer secret stands for, or undefined when it is unknown, revoked or
 * expired. Records the use, at most once per TOKEN_LAST_USED_RESOLUTION_MS.
 */
export async function authenticateTokenSecret(
  ds: DataSource,
  secret: string,
  now = Date.now(),
): Promise<{ tokenId: number; user: AuthenticatedUser } | undefined> {
  const row = await ds
    .getRepository(ApiTokenEntity)
    .createQueryBuilder('k')
    .innerJoinAndSelect('k.user', 'u')
    .where('k.tokenHash = :hash', { hash: hashTokenSecret(secret) })
    .getOne()
  if (!row || row.revokedAt !== null || row.expiresAt.getTime() <= now) return undefined
  if (!row.lastUsedAt || now - row.lastUsedAt.getTime() >= TOKEN_LAST_USED_RESOLUTION_MS) {
    await ds.getRepository(ApiTokenEntity).update({ id: row.id }, { lastUsedAt: new Date(now) })
  }
  const user: UserEntity = row.user
  return { tokenId: row.id, user: { id: user.id, email: user.email, displayName: user.displayName } }
}
