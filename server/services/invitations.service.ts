import { randomBytes } from 'node:crypto'
import type { DataSource, EntityManager } from 'typeorm'
import type { Role } from '../../shared/api/common'
import { ACCOUNT_LIMITS } from '../../shared/api/account'
import { TEAM_LIMITS, type Invitation, type InvitationLookup } from '../../shared/api/team'
import { InvitationEntity } from '../entities/invitation.entity'
import { MembershipEntity } from '../entities/membership.entity'
import { TeamEntity } from '../entities/team.entity'
import { UserEntity } from '../entities/user.entity'
import { HttpError, notFound } from '../errors/http-error'
import type { AuthenticatedUser } from '../middleware/authenticate'
import { hashPassword } from './auth.service'
import type { Mailer, MailMessage } from './mail.service'
import { hashTokenSecret } from './tokens.service'

/** Random bytes in a link's secret: 256 bits, beyond any guessing. */
const SECRET_BYTES = 32
const DAY_MS = 86_400_000
const INVITATION_LIFETIME_MS = TEAM_LIMITS.invitationDays * DAY_MS

/** One answer for every link that does not work, so a link says nothing about why. */
const invalidInvitation = () =>
  new HttpError(404, 'invalid_invitation', 'This invitation link does not work: it is unknown, already used, revoked or expired. Ask the team’s owner for a new one.')
const closedInvitation = () => new HttpError(409, 'invitation_closed', 'That invitation has already been accepted or revoked.')

/** An invitation as it stands: the secret of a new or resent one travels only in its mail. */
export interface SentInvitation {
  invitation: Invitation
  secret: string
}

function newSecret(): string {
  return randomBytes(SECRET_BYTES).toString('base64url')
}

/** The link a mail carries. */
export function invitationUrl(publicUrl: string, secret: string): string {
  return `${publicUrl.replace(/\/+$/, '')}/invitations/accept?token=${encodeURIComponent(secret)}`
}

export async function invitationTeamId(ds: DataSource, invitationId: number): Promise<number | undefined> {
  const row = await ds.getRepository(InvitationEntity).findOne({ where: { id: invitationId }, select: { id: true, teamId: true } })
  return row?.teamId
}

function toInvitation(row: InvitationEntity, now: number): Invitation {
  return {
    id: row.id,
    teamId: row.teamId,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy?.displayName ?? null,
    createdAt: row.createdAt.toISOString(),
    lastSentAt: row.lastSentAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    status: row.expiresAt.getTime() <= now ? 'expired' : 'pending',
  }
}

async function loadInvitation(m: EntityManager | DataSource, id: number): Promise<Invitation> {
  const row = await m.getRepository(InvitationEntity).findOneOrFail({ where: { id }, relations: { invitedBy: true } })
  return toInvitation(row, Date.now())
}

/** The team's open invitations (neither accepted nor revoked), newest first; expired ones included. */
export async function listInvitations(ds: DataSource, teamId: number): Promise<Invitation[]> {
  const rows = await ds
    .getRepository(InvitationEntity)
    .createQueryBuilder('i')
    .leftJoinAndSelect('i.invitedBy', 'u')
    .where('i.teamId = :teamId AND i.acceptedAt IS NULL AND i.revokedAt IS NULL', { teamId })
    .orderBy('i.createdAt', 'DESC')
    .addOrderBy('i.id', 'DESC')
    .getMany()
  const now = Date.now()
  return rows.map((r) => toInvitation(r, now))
}

/**
 * Invites an address: 409 `already_member` when an account with it is in the team; an open
 * invitation for the same address is revoked and replaced. Serialised per team by a lock
 * on the team's row, so two owners inviting at once leave one open invitation.
 */
export async function createInvitation(
  ds: DataSource,
  input: { teamId: number; invitedById: number; email: string; role: Role },
): Promise<SentInvitation> {
  const secret = newSecret()
  const id = await ds.transaction(async (m) => {
    await m.getRepository(TeamEntity).findOne({ where: { id: input.teamId }, lock: { mode: 'pessimistic_write' } })
    const member = await m
      .getRepository(MembershipEntity)
      .createQueryBuilder('ms')
      .innerJoin('ms.user', 'u')
      .where('ms.teamId = :teamId AND u.email = :email', { teamId: input.teamId, email: input.email })
      .getExists()
    if (member) throw new HttpError(409, 'already_member', `${input.email} is already a member of this team.`)
    const repo = m.getRepository(InvitationEntity)
    const now = new Date()
    await repo
      .createQueryBuilder()
      .update()
      .set({ revokedAt: now })
      .where('team_id = :teamId AND email = :email AND accepted_at IS NULL AND revoked_at IS NULL', { teamId: input.teamId, email: input.email })
      .execute()
    const saved = await repo.save(
      repo.create({
        teamId: input.teamId,
        email: input.email,
        role: input.role,
        tokenHash: hashTokenSecret(secret),
        invitedById: input.invitedById,
        expiresAt: new Date(now.getTime() + INVITATION_LIFETIME_MS),
        lastSentAt: now,
        acceptedAt: null,
        acceptedById: null,
        revokedAt: null,
      }),
    )
    return saved.id
  })
  return { invitation: await loadInvitation(ds, id), secret }
}

/** Locks an open invitation for a change; 409 `invitation_closed` once accepted or revoked. */
async function lockOpenInvitation(m: EntityManager, id: number): Promise<InvitationEntity> {
  const row = await m.getRepository(InvitationEntity).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } })
  if (!row) throw notFound('That invitation')
  if (row.acceptedAt !== null || row.revokedAt !== null) throw closedInvitation()
  return row
}

/** A new secret and a new expiry: the link of the earlier mail stops working. */
export async function resendInvitation(ds: DataSource, id: number): Promise<SentInvitation> {
  const secret = newSecret()
  await ds.transaction(async (m) => {
    await lockOpenInvitation(m, id)
    const now = new Date()
    await m.getRepository(InvitationEntity).update({ id }, { tokenHash: hashTokenSecret(secret), lastSentAt: now, expiresAt: new Date(now.getTime() + INVITATION_LIFETIME_MS) })
  })
  return { invitation: await loadInvitation(ds, id), secret }
}

/** Revokes an open invitation (again is a no-op); an accepted one is 409 `invitation_closed`. */
export async function revokeInvitation(ds: DataSource, id: number): Promise<void> {
  await ds.transaction(async (m) => {
    const row = await m.getRepository(InvitationEntity).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } })
    if (!row) throw notFound('That invitation')
    if (row.revokedAt !== null) return
    if (row.acceptedAt !== null) throw closedInvitation()
    await m.getRepository(InvitationEntity).update({ id }, { revokedAt: new Date() })
  })
}

/**
 * The invitation a secret opens while it still works, else 404 `invalid_invitation`. With
 * `lock` its row alone is locked for the transaction (then without team and inviter).
 */
async function findWorkingInvitation(m: EntityManager | DataSource, secret: string, lock: boolean): Promise<InvitationEntity> {
  const where = { tokenHash: hashTokenSecret(secret) }
  const row = await m
    .getRepository(InvitationEntity)
    .findOne(lock ? { where, lock: { mode: 'pessimistic_write' } } : { where, relations: { team: true, invitedBy: true } })
  if (!row || row.acceptedAt !== null || row.revokedAt !== null || row.expiresAt.getTime() <= Date.now()) throw invalidInvitation()
  return row
}

/** What the accept page shows before anything is decided. */
export async function lookupInvitation(ds: DataSource, secret: string): Promise<InvitationLookup> {
  const row = await findWorkingInvitation(ds, secret, false)
  const accountExists = await ds.getRepository(UserEntity).existsBy({ email: row.email })
  return {
    teamId: row.teamId,
    teamName: row.team.name,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy?.displayName ?? null,
    accountExists,
    expiresAt: row.expiresAt.toISOString(),
  }
}

export interface AcceptedInvitation {
  user: AuthenticatedUser
  /** True when the account was made by this acceptance. */
  created: boolean
  teamId: number
  role: Role
}

/**
 * Accepts an invitation once, under a lock on its row: creates the account when none has
 * the address (displayName and password required), else requires `caller` to be that
 * account (409 `sign_in_required`). Someone already in the team keeps their role.
 * Resolves to the account and whether it was made now.
 */
export async function acceptInvitation(
  ds: DataSource,
  input: { secret: string; displayName?: string; password?: string },
  caller: AuthenticatedUser | undefined,
): Promise<AcceptedInvitation> {
  // Hashed before the transaction: bcrypt takes a tenth of a second, the row lock need not wait for it.
  const passwordHash = input.password === undefined ? undefined : await hashPassword(input.password)
  return ds.transaction(async (m) => {
    const invitation = await findWorkingInvitation(m, input.secret, true)
    const users = m.getRepository(UserEntity)
    let user = await users.findOneBy({ email: invitation.email })
    const created = !user
    if (!user) {
      const missing = [
        ...(input.displayName === undefined ? [{ path: 'body.displayName', message: 'Enter your name.' }] : []),
        ...(passwordHash === undefined ? [{ path: 'body.password', message: `Choose a password of at least ${ACCOUNT_LIMITS.passwordMinChars} characters.` }] : []),
      ]
      if (missing.length > 0) throw new HttpError(400, 'validation', `${missing[0].message} (${missing[0].path})`, missing)
      user = await users.save(users.create({ email: invitation.email, displayName: input.displayName, passwordHash, lastActiveAt: null }))
    } else if (caller?.id !== user.id) {
      throw new HttpError(409, 'sign_in_required', `This invitation is for the existing account ${invitation.email}: sign in as ${invitation.email}, then open the link again to accept it.`)
    }
    const memberships = m.getRepository(MembershipEntity)
    if (!(await memberships.existsBy({ teamId: invitation.teamId, userId: user.id }))) {
      await memberships.save(memberships.create({ teamId: invitation.teamId, userId: user.id, role: invitation.role }))
    }
    await m.getRepository(InvitationEntity).update({ id: invitation.id }, { acceptedAt: new Date(), acceptedById: user.id })
    return { user: { id: user.id, email: user.email, displayName: user.displayName }, created, teamId: invitation.teamId, role: invitation.role }
  })
}

/** The invitation mail: who invites, to which team, with which role, the link and when it stops working. */
export function composeInvitationMail(
  invitation: Pick<Invitation, 'email' | 'role' | 'expiresAt'>,
  names: { inviter: string; team: string },
  url: string,
): MailMessage {
  const expires = new Date(invitation.expiresAt).toUTCString()
  const lines = [
    `${names.inviter} invites you to the team “${names.team}” on Rootcast, with the role ${invitation.role}.`,
    '',
    'Accept the invitation here:',
    url,
    '',
    `The link works once and until ${expires}. If you did not expect this mail, ignore it: nothing happens unless the link is opened and accepted.`,
  ]
  return { to: [invitation.email], subject: `${names.inviter} invites you to ${names.team} on Rootcast`, text: lines.join('\n') }
}

/**
 * Mails a new or resent invitation. Without a mailer nothing is sent; a failed send is
 * answered 502 `mail_failed` (the invitation stays and can be resent).
 */
export async function mailInvitation(
  ds: DataSource,
  deps: { mailer?: Mailer; publicUrl: string },
  sent: SentInvitation,
  inviter: AuthenticatedUser,
): Promise<void> {
  if (!deps.mailer) return
  const team = await ds.getRepository(TeamEntity).findOneByOrFail({ id: sent.invitation.teamId })
  const message = composeInvitationMail(sent.invitation, { inviter: inviter.displayName, team: team.name }, invitationUrl(deps.publicUrl, sent.secret))
  try {
    await deps.mailer.send(message)
  } catch (cause) {
    console.error(`[rootcast] invitation mail ${sent.invitation.id} failed:`, cause)
    throw new HttpError(502, 'mail_failed', 'The invitation is saved but its mail could not be sent. Check the mail settings, then resend it.')
  }
}
