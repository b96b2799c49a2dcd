import type { DataSource, EntityManager } from 'typeorm'
import type { Role } from '../../shared/api/common'
import { MembershipEntity } from '../entities/membership.entity'
import { PathEntity, type FillRule } from '../entities/path.entity'
import { ProjectEntity } from '../entities/project.entity'
import { RevisionEntity } from '../entities/revision.entity'
import { TeamEntity } from '../entities/team.entity'
import { UserEntity } from '../entities/user.entity'
import { hashPassword } from './auth.service'

/** The invented demo studio; the three addresses are fixed by the computation API contract. */
export const DEMO_TEAM = 'Harbour Type Workshop'
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'owner@example.com', displayName: 'Morwenna Quay', role: 'owner' },
  { email: 'editor@example.com', displayName: 'Tobias Slipway', role: 'editor' },
  { email: 'viewer@example.com', displayName: 'Ines Lighthouse', role: 'viewer' },
]

/** Icons drawn for the demo on a 24-unit grid: lines, cubics, a quadratic, arcs and a self-crossing loop. */
export const DEMO_PATHS: ReadonlyArray<{ name: string; fillRule: FillRule; data: string }> = [
  { name: 'Arrow east', fillRule: 'nonzero', data: 'M4 11H14V6L22 12L14 18V13H4Z' },
  {
    name: 'Map pin',
    fillRule: 'evenodd',
    data: 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z M12 6.5A2.5 2.5 0 1 1 12 11.5A2.5 2.5 0 1 1 12 6.5Z',
  },
  { name: 'Lift sign', fillRule: 'nonzero', data: 'M5 3H19A2 2 0 0 1 21 5V19A2 2 0 0 1 19 21H5A2 2 0 0 1 3 19V5A2 2 0 0 1 5 3Z' },
  { name: 'Stair', fillRule: 'nonzero', data: 'M3 20V16H8V12H13V8H18V4H21V20Z' },
  { name: 'Ferry', fillRule: 'nonzero', data: 'M2 15H22L19.5 20Q12 21.5 4.5 20Z M6 14V10H17L19 14Z M9 9V6H13V9Z' },
  { name: 'Crossing knot', fillRule: 'nonzero', data: 'M12 12C4 2 4 22 12 12C20 2 20 22 12 12Z' },
]

/**
 * Seeds the demo team when the database has no users at all. Returns false when there was
 * something already. Everything goes in one transaction: all of it or none.
 */
export async function seedDemo(ds: DataSource, password: string): Promise<boolean> {
  if ((await ds.getRepository(UserEntity).count()) > 0) return false
  const passwordHash = await hashPassword(password)
  await ds.transaction(async (m: EntityManager) => {
    const team = await m.getRepository(TeamEntity).save({ name: DEMO_TEAM })
    const users: UserEntity[] = []
    for (const a of DEMO_ACCOUNTS) {
      const user = await m.getRepository(UserEntity).save({ email: a.email, displayName: a.displayName, passwordHash })
      await m.getRepository(MembershipEntity).save({ teamId: team.id, userId: user.id, role: a.role })
      users.push(user)
    }
    const editor = users[1]
    const project = await m.getRepository(ProjectEntity).save({
      teamId: team.id,
      name: 'Wayfinding icons',
      description: 'Signage icons for the harbour ferry terminal: arrows, a map pin, a lift, a stair, the ferry itself.',
      createdById: editor.id,
    })
    for (const p of DEMO_PATHS) {
      const path = await m.getRepository(PathEntity).save({ projectId: project.id, name: p.name, fillRule: p.fillRule, origin: 'drawn', units: 'px' })
      const rev = await m.getRepository(RevisionEntity).save({ pathId: path.id, number: 1, data: p.data, message: 'Drawn for the terminal signage', authorId: editor.id })
      await m.getRepository(PathEntity).update({ id: path.id }, { currentRevisionId: rev.id })
    }
  })
  return true
}
