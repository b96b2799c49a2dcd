import request from 'supertest'
import type { DataSource } from 'typeorm'
import { createApp, type RootcastApp } from '../../server/app'
import { loadConfig } from '../../server/config'
import { MembershipEntity } from '../../server/entities/membership.entity'
import { TeamEntity } from '../../server/entities/team.entity'
import { UserEntity } from '../../server/entities/user.entity'
import type { AuditQueue } from '../../server/jobs/audit-queue'
import { hashPassword } from '../../server/services/auth.service'
import type { Mailbox, Mailer } from '../../server/services/mail.service'
import { seedDemo } from '../../server/services/seed.service'

/** Not the product's default demo password, so a test cannot pass by accident on the default. */
export const TEST_PASSWORD = 'harbour-test-pass-7'
export const OUTSIDER = { email: 'outsider@example.org', displayName: 'Pilot From Elsewhere' }
export const TEST_SESSION_SECRET = 'test-session-secret-0123456789abcdef0123'

export function testConfig(env: Record<string, string> = {}) {
  return loadConfig({ NODE_ENV: 'test', ROOTCAST_DEMO_PASSWORD: TEST_PASSWORD, ...env })
}

export function buildTestApp(
  ds: DataSource,
  opts: { env?: Record<string, string>; clientDir?: string; mailer?: Mailer; mailbox?: Mailbox; auditQueue?: AuditQueue } = {},
): RootcastApp {
  return createApp({
    config: testConfig(opts.env), dataSource: ds, sessionSecret: TEST_SESSION_SECRET, clientDir: opts.clientDir,
    mailer: opts.mailer, mailbox: opts.mailbox, auditQueue: opts.auditQueue,
  })
}

/** The demo team plus a second team with one owner, who must never see the demo team's work. */
export async function seedTestData(ds: DataSource): Promise<{ demoTeamId: number; otherTeamId: number }> {
  await seedDemo(ds, TEST_PASSWORD)
  const demo = await ds.getRepository(TeamEntity).findOneByOrFail({ name: 'Harbour Type Workshop' })
  const other = await ds.getRepository(TeamEntity).save({ name: 'Estuary Sign Co.' })
  const user = await ds.getRepository(UserEntity).save({ ...OUTSIDER, passwordHash: await hashPassword(TEST_PASSWORD) })
  await ds.getRepository(MembershipEntity).save({ teamId: other.id, userId: user.id, role: 'owner' })
  return { demoTeamId: demo.id, otherTeamId: other.id }
}

export interface SignedIn {
  agent: ReturnType<typeof request.agent>
  csrf: string
}

export async function signIn(app: RootcastApp['app'], email: string, password = TEST_PASSWORD): Promise<SignedIn> {
  const agent = request.agent(app)
  const res = await agent.post('/api/v1/auth/login').send({ email, password })
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { agent, csrf: res.body.csrfToken as string }
}
