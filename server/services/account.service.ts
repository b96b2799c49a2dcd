import { randomBytes } from 'node:crypto'
import bcrypt from 'bcryptjs'
import type { DataSource, EntityManager } from 'typeorm'
import { IsNull } from 'typeorm'
import { PASSWORD_RESET_LIFETIME_MINUTES } from '../../shared/api/account'
import { PasswordResetEntity } from '../entities/password-reset.entity'
import { UserEntity } from '../entities/user.entity'
import { HttpError } from '../errors/http-error'
import type { AuthenticatedUser } from '../middleware/authenticate'
import { hashPassword } from './auth.service'
import type { MailMessage } from './mail.service'
import { hashTokenSecret } from './tokens.service'

/** Random bytes in a reset token: 256 bits, beyond any guessing (as for API tokens). */
const RESET_TOKEN_BYTES = 32
const MINUTE_MS = 60_000

/** The person's new display name; answers the person as the session now sees them. */
export async function updateDisplayName(ds: DataSource, userId: number, displayName: string): Promise<AuthenticatedUser> {
  return ds.transaction(async (m) => {
    const users = m.getRepository(UserEntity)
    await users.update({ id: userId }, { displayName })
    const user = await users.findOneByOrFail({ id: userId })
    return { id: user.id, email: user.email, displayName: user.displayName }
  })
}

/**
 * Deletes the person's rows from `sessions` (express-mysql-session keeps the session as
 * JSON holding `userId`), except `keepSessionId` when given. Resolves to how many went.
 */
async function deleteSessionsOf(m: EntityManager, userId: number, keepSessionId?: string): Promise<number> {
  const result = (await m.query(
    "DELETE FROM `sessions` WHERE JSON_VALUE(`data`, '$.userId') = ? AND `session_id` <> ?",
    [String(userId), keepSessionId ?? ''],
  )) as { affectedRows?: number }
  return Number(result.affectedRows ?? 0)
}

/** Signs out every other session of the person; this one (`keepSessionId`) stays. */
export function revokeOtherSessions(ds: DataSource, userId: number, keepSessionId: string): Promise<number> {
  return ds.transaction((m) => deleteSessionsOf(m, userId, keepSessionId))
}

/**
 * Sets a new password after checking the current one (400 `wrong_password` otherwise) and
 * signs out the person's other sessions; `keepSessionId` stays signed in.
 */
export async function changePassword(
  ds: DataSource,
  userId: number,
  keepSessionId: string,
  input: { currentPassword: string; newPassword: string },
): Promise<void> {
  const user = await ds.getRepository(UserEntity).findOneByOrFail({ id: userId })
  if (!(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
    throw new HttpError(400, 'wrong_password', 'That is not your current password.')
  }
  const passwordHash = await hashPassword(input.newPassword)
  await ds.transaction(async (m) => {
    await m.getRepository(UserEntity).update({ id: userId }, { passwordHash })
    await deleteSessionsOf(m, userId, keepSessionId)
  })
}

/** The mail with the reset link; the link is the only place the token appears. */
export function composePasswordResetMail(to: string, link: string): MailMessage {
  const text = [
    'Someone, probably you, asked to set a new password for your Rootcast account.',
    '',
    `Set a new password: ${link}`,
    '',
    `The link works once, for ${PASSWORD_RESET_LIFETIME_MINUTES} minutes. Setting a new password signs you out everywhere.`,
    'If you did not ask for this, ignore this mail: your password stays as it is.',
  ].join('\n')
  return { to: [to], subject: 'Rootcast: set a new password', text }
}

/**
 * Issues a reset token for the address when an account uses it, else undefined. The token
 * is drawn and hashed either way, so both outcomes do the same work but one small insert.
 */
export async function issuePasswordReset(
  ds: DataSource,
  email: string,
  now = Date.now(),
): Promise<{ email: string; token: string } | undefined> {
  const token = randomBytes(RESET_TOKEN_BYTES).toString('base64url')
  const tokenHash = hashTokenSecret(token)
  const user = await ds.getRepository(UserEntity).findOneBy({ email })
  if (!user) return undefined
  await ds.transaction((m) =>
    m.getRepository(PasswordResetEntity).insert({
      userId: user.id,
      tokenHash,
      expiresAt: new Date(now + PASSWORD_RESET_LIFETIME_MINUTES * MINUTE_MS),
      usedAt: null,
    }),
  )
  return { email: user.email, token }
}

const invalidResetToken = () =>
  new HttpError(400, 'invalid_token', 'This reset link is not valid: it was used already, has expired, or is not a link we sent. Ask for a new one.')

/**
 * Sets the password of the token's person, marks that token and every other open one of
 * theirs used, and signs out all their sessions. Unknown, used or expired: 400 `invalid_token`.
 */
export async function confirmPasswordReset(ds: DataSource, token: string, password: string, now = Date.now()): Promise<void> {
  const tokenHash = hashTokenSecret(token)
  // Hashed before the transaction, so the row lock is not held through bcrypt's work.
  const passwordHash = await hashPassword(password)
  await ds.transaction(async (m) => {
    const resets = m.getRepository(PasswordResetEntity)
    const row = await resets.findOne({ where: { tokenHash }, lock: { mode: 'pessimistic_write' } })
    if (!row || row.usedAt !== null || row.expiresAt.getTime() <= now) throw invalidResetToken()
    await resets.update({ userId: row.userId, usedAt: IsNull() }, { usedAt: new Date(now) })
    await m.getRepository(UserEntity).update({ id: row.userId }, { passwordHash })
    await deleteSessionsOf(m, row.userId)
  })
}
