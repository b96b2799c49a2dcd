import type { DataSource, EntityManager } from 'typeorm'
import type { Role } from '../../shared/api/common'
import type { Member } from '../../shared/api/team'
import { MembershipEntity } from '../entities/membership.entity'
import { UserEntity } from '../entities/user.entity'
import { HttpError, notFound } from '../errors/http-error'

const lastOwner = () =>
  new HttpError(409, 'last_owner', 'A team always keeps at least one owner: make someone else an owner first.')

interface MemberRow {
  userId: number
  displayName: string
  email: string
  role: Role
  joinedAt: Date
  lastActiveAt: Date | null
}

function membersQuery(m: EntityManager | DataSource, teamId: number) {
  return m
    .getRepository(MembershipEntity)
    .createQueryBuilder('ms')
    .innerJoin('ms.user', 'u')
    .select(['u.id AS userId', 'u.displayName AS displayName', 'u.email AS email', 'ms.role AS role', 'ms.createdAt AS joinedAt', 'u.lastActiveAt AS lastActiveAt'])
    .where('ms.teamId = :teamId', { teamId })
}

function toMember(r: MemberRow): Member {
  return {
    userId: Number(r.userId),
    displayName: r.displayName,
    email: r.email,
    role: r.role,
    joinedAt: new Date(r.joinedAt).toISOString(),
    lastActiveAt: r.lastActiveAt === null ? null : new Date(r.lastActiveAt).toISOString(),
  }
}

/** The team's members: owners first, then editors and viewers, each by name. */
export async function listMembers(ds: DataSource, teamId: number): Promise<Member[]> {
  const rows = await membersQuery(ds, teamId)
    .orderBy("FIELD(ms.role, 'owner', 'editor', 'viewer')", 'ASC')
    .addOrderBy('u.displayName', 'ASC')
    .addOrderBy('u.id', 'ASC')
    .getRawMany<MemberRow>()
  return rows.map(toMember)
}

/**
 * Locks every membership of the team (so two owners cannot demote each other at once) and
 * answers the target's; 404 when they are not in the team. Throws 409 `last_owner` when
 * `leavesOwners` and the target is the only owner.
 */
async function lockMembership(m: EntityManager, teamId: number, userId: number, leavesOwners: boolean): Promise<MembershipEntity> {
  const rows = await m.getRepository(MembershipEntity).find({ where: { teamId }, lock: { mode: 'pessimistic_write' } })
  const target = rows.find((r) => r.userId === userId)
  if (!target) throw notFound('That member')
  const owners = rows.filter((r) => r.role === 'owner').length
  if (target.role === 'owner' && owners <= 1 && leavesOwners) throw lastOwner()
  return target
}

/** Gives a member another role; the last owner cannot be demoted (409 `last_owner`). */
export async function changeMemberRole(ds: DataSource, teamId: number, userId: number, role: Role): Promise<Member> {
  return ds.transaction(async (m) => {
    const target = await lockMembership(m, teamId, userId, role !== 'owner')
    if (target.role !== role) await m.getRepository(MembershipEntity).update({ id: target.id }, { role })
    const row = await membersQuery(m, teamId).andWhere('ms.userId = :userId', { userId }).getRawOne<MemberRow>()
    return toMember(row!)
  })
}

export interface RemovedMember {
  displayName: string
}

/** Removes a member (or lets one leave); the last owner cannot go (409 `last_owner`). */
export async function removeMember(ds: DataSource, teamId: number, userId: number): Promise<RemovedMember> {
  return ds.transaction(async (m) => {
    const target = await lockMembership(m, teamId, userId, true)
    const user = await m.getRepository(UserEntity).findOneByOrFail({ id: userId })
    await m.getRepository(MembershipEntity).delete({ id: target.id })
    return { displayName: user.displayName }
  })
}
