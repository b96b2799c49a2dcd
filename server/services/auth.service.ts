import bcrypt from 'bcryptjs'
import type { DataSource } from 'typeorm'
import type { SessionInfo, TeamMembership } from '../../shared/api/auth'
import type { Role } from '../../shared/api/common'
import { MembershipEntity } from '../entities/membership.entity'
import { UserEntity } from '../entities/user.entity'
import { HttpError } from '../errors/http-error'
import type { AuthenticatedUser } from '../middleware/authenticate'

/** bcrypt work factor: 2^11 rounds, about 0.1 s per check in bcryptjs on this class of machine. */
export const PASSWORD_HASH_ROUNDS = 11

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, PASSWORD_HASH_ROUNDS)
}

/** Compared against when the address is unknown, so both answers take as long. */
const UNKNOWN_USER_HASH = bcrypt.hashSync('no such user: rootcast', PASSWORD_HASH_ROUNDS)

export async function verifyCredentials(ds: DataSource, email: string, password: string): Promise<AuthenticatedUser> {
  const user = await ds.getRepository(UserEntity).findOneBy({ email })
  const ok = await bcrypt.compare(password, user?.passwordHash ?? UNKNOWN_USER_HASH)
  if (!user || !ok) throw new HttpError(401, 'invalid_credentials', 'That e-mail address and password do not match an account.')
  return { id: user.id, email: user.email, displayName: user.displayName }
}

export async function teamsOf(ds: DataSource, userId: number): Promise<TeamMembership[]> {
  const rows = await ds
    .getRepository(MembershipEntity)
    .createQueryBuilder('m')
    .innerJoin('m.team', 't')
    .select(['m.role AS role', 't.id AS id', 't.name AS name'])
    .where('m.userId = :userId', { userId })
    .orderBy('t.name', 'ASC')
    .getRawMany<{ id: number; name: string; role: Role }>()
  return rows.map((r) => ({ id: Number(r.id), name: r.name, role: r.role }))
}

export async function roleInTeam(ds: DataSource, userId: number, teamId: number): Promise<Role | undefined> {
  const m = await ds.getRepository(MembershipEntity).findOneBy({ userId, teamId })
  return m?.role
}

export async function sessionInfo(ds: DataSource, user: AuthenticatedUser, csrfToken: string): Promise<SessionInfo> {
  return { user, teams: await teamsOf(ds, user.id), csrfToken }
}
