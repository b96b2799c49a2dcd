import { createHash } from 'node:crypto'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { InvitationEntity } from '../../server/entities/invitation.entity'
import { MembershipEntity } from '../../server/entities/membership.entity'
import { UserEntity } from '../../server/entities/user.entity'
import { hashPassword } from '../../server/services/auth.service'
import type { DevMailMessage } from '../../shared/api/dev-mail'
import { buildTestApp, OUTSIDER, seedTestData, signIn, TEST_PASSWORD, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, type TestMailbox } from '../helpers/test-mail'

let db: TestDatabase
let rc: RootcastApp
let mailbox: TestMailbox
let demoTeamId: number
let otherTeamId: number
const as: Record<'owner' | 'editor' | 'viewer' | 'outsider', SignedIn> = {} as never
type Who = keyof typeof as

/** Not the product's default address, so a link cannot pass on the default by accident. */
const PUBLIC_URL = 'https://rootcast.harbour.test'
const DAY_MS = 86_400_000
/**
 * expiresAt is Date.now() + 7 days in the service, checked against Date.now() here a moment
 * later on the same machine: they differ by one request's duration, far below this.
 */
const SAME_REQUEST_SKEW_MS = 5_000
/** 32 random bytes in base64url without padding: ceil(32·4/3) = 43 characters. */
const LINK_PATTERN = new RegExp(`${PUBLIC_URL.replace(/[.]/g, '\\.')}/invitations/accept\\?token=([A-Za-z0-9_-]{43})(?:\\s|$)`)
/** A password that meets the 10-character minimum of the Account rules. */
const NEW_PASSWORD = 'pier-lamp-1907'

function asUser(who: Who, method: 'get' | 'post' | 'patch' | 'delete', url: string, body?: object) {
  const req = as[who].agent[method](`/api/v1${url}`).set('X-CSRF-Token', as[who].csrf)
  return body ? req.send(body) : req
}
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex')
const userId = async (email: string) => (await db.ds.getRepository(UserEntity).findOneByOrFail({ email })).id
const invitationRow = (id: number) => db.ds.getRepository(InvitationEntity).findOneByOrFail({ id })

/** Invites as the owner of the demo team and answers the invitation and the secret of its mail. */
async function invite(email: string, role: 'owner' | 'editor' | 'viewer' = 'viewer'): Promise<{ id: number; secret: string; body: Record<string, unknown>; mail: DevMailMessage }> {
  const before = mailbox.fake.messages().length
  const res = await asUser('owner', 'post', `/teams/${demoTeamId}/invitations`, { email, role })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const mail = await mailbox.waitForMessage((m) => mailbox.fake.messages().indexOf(m) >= before && m.to.includes(res.body.email))
  const secret = LINK_PATTERN.exec(mail.text)?.[1]
  expect(secret, mail.text).toBeDefined()
  return { id: res.body.id, secret: secret!, body: res.body, mail }
}
const lookup = (secret: string) => request(rc.app).get('/api/v1/invitations/lookup').query({ token: secret })

/** An account of our own, outside every team, for tests that change memberships. */
async function makeAccount(email: string, displayName: string): Promise<number> {
  const saved = await db.ds.getRepository(UserEntity).save({ email, displayName, passwordHash: await hashPassword(TEST_PASSWORD) })
  return saved.id
}
async function addMember(teamId: number, id: number, role: 'owner' | 'editor' | 'viewer'): Promise<void> {
  await db.ds.getRepository(MembershipEntity).save({ teamId, userId: id, role })
}

beforeAll(async () => {
  db = await createTestDatabase()
  ;({ demoTeamId, otherTeamId } = await seedTestData(db.ds))
  mailbox = await startTestMailbox()
  rc = buildTestApp(db.ds, { mailer: mailbox.mailer, env: { ROOTCAST_PUBLIC_URL: PUBLIC_URL } })
  for (const who of ['owner', 'editor', 'viewer'] as const) as[who] = await signIn(rc.app, `${who}@example.com`)
  as.outsider = await signIn(rc.app, OUTSIDER.email)
})
afterAll(async () => {
  await rc?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('inviting by e-mail', () => {
  it('mails the link under the public address with inviter, team, role and expiry, and keeps only a hash', async () => {
    const { id, secret, body, mail } = await invite('  Rhoda.Breakwater@Harbour.TEST ', 'editor')
    expect(body).toMatchObject({ teamId: demoTeamId, email: 'rhoda.breakwater@harbour.test', role: 'editor', invitedBy: 'Morwenna Quay', status: 'pending' })
    const lifetime = Date.parse(body.expiresAt as string) - Date.now()
    expect(Math.abs(lifetime - 7 * DAY_MS)).toBeLessThan(SAME_REQUEST_SKEW_MS)

    expect(mail.to).toEqual(['rhoda.breakwater@harbour.test'])
    expect(mail.subject).toBe('Morwenna Quay invites you to Harbour Type Workshop on Rootcast')
    expect(mail.text).toContain('with the role editor')
    expect(mail.text).toContain(`${PUBLIC_URL}/invitations/accept?token=${secret}`)
    expect(mail.text).toContain(`until ${new Date(body.expiresAt as string).toUTCString()}`)

    const row = await invitationRow(id)
    expect(row.tokenHash).toBe(sha256(secret))
    const [raw] = (await db.ds.query('SELECT * FROM invitations WHERE id = ?', [id])) as Array<Record<string, unknown>>
    expect(JSON.stringify(raw)).not.toContain(secret.slice(0, 20))

    const list = await asUser('owner', 'get', `/teams/${demoTeamId}/invitations`)
    expect(list.status).toBe(200)
    expect(list.body.items.find((i: { id: number }) => i.id === id)).toEqual(body)
  })

  it('replaces an open invitation for the same address: the older link stops working', async () => {
    const first = await invite('quayside.lettering@harbour.test', 'viewer')
    const second = await invite('quayside.lettering@harbour.test', 'editor')
    expect((await invitationRow(first.id)).revokedAt).not.toBeNull()
    expect((await lookup(first.secret)).status).toBe(404)
    const found = await lookup(second.secret)
    expect(found.status).toBe(200)
    expect(found.body.role).toBe('editor')
    const list = await asUser('owner', 'get', `/teams/${demoTeamId}/invitations`)
    expect(list.body.items.filter((i: { email: string }) => i.email === 'quayside.lettering@harbour.test').map((i: { id: number }) => i.id)).toEqual([second.id])
  })

  it('answers 409 already_member for an address in the team, and 400 for a bad address or role', async () => {
    const member = await asUser('owner', 'post', `/teams/${demoTeamId}/invitations`, { email: 'Editor@Example.com', role: 'viewer' })
    expect(member.status).toBe(409)
    expect(member.body.error.code).toBe('already_member')
    for (const [what, body, path] of [
      ['no address', { role: 'viewer' }, 'body.email'],
      ['not an address', { email: 'harbour', role: 'viewer' }, 'body.email'],
      ['unknown role', { email: 'pilot@harbour.test', role: 'admin' }, 'body.role'],
    ] as const) {
      const res = await asUser('owner', 'post', `/teams/${demoTeamId}/invitations`, body)
      expect(res.status, what).toBe(400)
      expect(res.body.error.details.map((d: { path: string }) => d.path), what).toContain(path)
    }
  })

  it('is for owners only: editors and viewers 403, another team’s owner 404', async () => {
    const { id } = await invite('ropewalk.press@harbour.test')
    for (const who of ['editor', 'viewer'] as const) {
      expect((await asUser(who, 'post', `/teams/${demoTeamId}/invitations`, { email: 'x@harbour.test', role: 'viewer' })).status, who).toBe(403)
      expect((await asUser(who, 'get', `/teams/${demoTeamId}/invitations`)).status, who).toBe(403)
      expect((await asUser(who, 'post', `/invitations/${id}/resend`)).status, who).toBe(403)
      expect((await asUser(who, 'delete', `/invitations/${id}`)).status, who).toBe(403)
    }
    expect((await asUser('outsider', 'get', `/teams/${demoTeamId}/invitations`)).status).toBe(404)
    expect((await asUser('outsider', 'post', `/invitations/${id}/resend`)).status).toBe(404)
    expect((await asUser('outsider', 'delete', `/invitations/${id}`)).status).toBe(404)
    expect((await invitationRow(id)).revokedAt).toBeNull()
  })
})

describe('accepting', () => {
  it('creates the account, signs it in, and refuses the link a second time', async () => {
    const { secret } = await invite('Ansel.Tidewater@harbour.test', 'editor')
    const found = await lookup(secret)
    expect(found.status).toBe(200)
    expect(found.body).toMatchObject({ teamId: demoTeamId, teamName: 'Harbour Type Workshop', email: 'ansel.tidewater@harbour.test', role: 'editor', invitedBy: 'Morwenna Quay', accountExists: false })

    const agent = request.agent(rc.app)
    const missing = await agent.post('/api/v1/invitations/accept').send({ token: secret })
    expect(missing.status).toBe(400)
    expect(missing.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.displayName', 'body.password'])
    const short = await agent.post('/api/v1/invitations/accept').send({ token: secret, displayName: 'Ansel Tidewater', password: 'nine-char' })
    expect(short.status).toBe(400)
    expect(short.body.error.details.map((d: { path: string }) => d.path)).toContain('body.password')
    expect(await db.ds.getRepository(UserEntity).existsBy({ email: 'ansel.tidewater@harbour.test' })).toBe(false)

    const accepted = await agent.post('/api/v1/invitations/accept').send({ token: secret, displayName: '  Ansel Tidewater ', password: NEW_PASSWORD })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.user).toMatchObject({ email: 'ansel.tidewater@harbour.test', displayName: 'Ansel Tidewater' })
    expect(accepted.body.teams).toEqual([{ id: demoTeamId, name: 'Harbour Type Workshop', role: 'editor' }])
    expect(accepted.body.csrfToken).toMatch(/^[A-Za-z0-9_-]{32}$/)
    // The answer's session works, and the new password signs in.
    const me = await agent.get('/api/v1/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe('ansel.tidewater@harbour.test')
    const projects = await agent.get(`/api/v1/teams/${demoTeamId}/projects`)
    expect(projects.status).toBe(200)
    expect(projects.body.items.map((p: { name: string }) => p.name)).toContain('Wayfinding icons')
    await signIn(rc.app, 'ansel.tidewater@harbour.test', NEW_PASSWORD)

    for (const again of [
      await request(rc.app).post('/api/v1/invitations/accept').send({ token: secret, displayName: 'Someone Else', password: NEW_PASSWORD }),
      await lookup(secret),
    ]) {
      expect(again.status).toBe(404)
      expect(again.body.error.code).toBe('invalid_invitation')
    }
    const memberships = await db.ds.getRepository(MembershipEntity).countBy({ userId: accepted.body.user.id })
    expect(memberships).toBe(1)
    const log = (await db.ds.query("SELECT team_id AS teamId, actor_id AS actorId, via, summary FROM activity WHERE action = 'joined' AND target_id = ?", [accepted.body.user.id])) as Array<Record<string, unknown>>
    expect(log).toEqual([{ teamId: demoTeamId, actorId: accepted.body.user.id, via: 'link', summary: 'Ansel Tidewater joined the team as editor, with a new account.' }])
  })

  it('adds an existing account only when it is signed in as itself, with its CSRF token', async () => {
    const outsiderId = await userId(OUTSIDER.email)
    const { secret } = await invite(OUTSIDER.email, 'viewer')
    expect((await lookup(secret)).body.accountExists).toBe(true)

    const anonymous = await request(rc.app).post('/api/v1/invitations/accept').send({ token: secret })
    expect(anonymous.status).toBe(409)
    expect(anonymous.body.error.code).toBe('sign_in_required')
    expect(anonymous.body.error.message).toContain(`sign in as ${OUTSIDER.email}`)
    const someoneElse = await asUser('viewer', 'post', '/invitations/accept', { token: secret })
    expect(someoneElse.status).toBe(409)
    expect(someoneElse.body.error.code).toBe('sign_in_required')
    const noCsrf = await as.outsider.agent.post('/api/v1/invitations/accept').send({ token: secret })
    expect(noCsrf.status).toBe(403)
    expect(noCsrf.body.error.code).toBe('csrf')
    expect(await db.ds.getRepository(MembershipEntity).existsBy({ userId: outsiderId, teamId: demoTeamId })).toBe(false)

    const accepted = await asUser('outsider', 'post', '/invitations/accept', { token: secret })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.csrfToken).toBe(as.outsider.csrf)
    expect(accepted.body.teams).toEqual([
      { id: otherTeamId, name: 'Estuary Sign Co.', role: 'owner' },
      { id: demoTeamId, name: 'Harbour Type Workshop', role: 'viewer' },
    ])
    const row = await db.ds.getRepository(InvitationEntity).findOneByOrFail({ tokenHash: sha256(secret) })
    expect(row.acceptedById).toBe(outsiderId)
    expect(row.acceptedAt).not.toBeNull()
    expect((await asUser('outsider', 'post', '/invitations/accept', { token: secret })).status).toBe(404)
    await db.ds.getRepository(MembershipEntity).delete({ userId: outsiderId, teamId: demoTeamId })
  })

  it('refuses an expired link with the one answer for lookup and accept, and lists it as expired', async () => {
    const { id, secret } = await invite('slipway.signs@harbour.test', 'viewer')
    await db.ds.query('UPDATE invitations SET expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), id])
    for (const res of [await lookup(secret), await request(rc.app).post('/api/v1/invitations/accept').send({ token: secret, displayName: 'Slip Way', password: NEW_PASSWORD })]) {
      expect(res.status).toBe(404)
      expect(res.body.error.code).toBe('invalid_invitation')
    }
    const listed = await asUser('owner', 'get', `/teams/${demoTeamId}/invitations`)
    expect(listed.body.items.find((i: { id: number }) => i.id === id).status).toBe('expired')
    expect(await db.ds.getRepository(UserEntity).existsBy({ email: 'slipway.signs@harbour.test' })).toBe(false)
  })

  it('refuses a revoked link; revoking again is a no-op, an accepted one cannot be revoked', async () => {
    const { id, secret } = await invite('lantern.row@harbour.test', 'editor')
    expect((await asUser('owner', 'delete', `/invitations/${id}`)).status).toBe(204)
    expect((await asUser('owner', 'delete', `/invitations/${id}`)).status).toBe(204)
    const res = await request(rc.app).post('/api/v1/invitations/accept').send({ token: secret, displayName: 'Lantern Row', password: NEW_PASSWORD })
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('invalid_invitation')
    expect((await lookup(secret)).status).toBe(404)
    const list = await asUser('owner', 'get', `/teams/${demoTeamId}/invitations`)
    expect(list.body.items.map((i: { id: number }) => i.id)).not.toContain(id)
    expect((await asUser('owner', 'post', `/invitations/${id}/resend`)).status).toBe(409)

    const taken = await invite('mooring.post@harbour.test', 'viewer')
    const accepted = await request(rc.app).post('/api/v1/invitations/accept').send({ token: taken.secret, displayName: 'Mooring Post', password: NEW_PASSWORD })
    expect(accepted.status).toBe(200)
    const late = await asUser('owner', 'delete', `/invitations/${taken.id}`)
    expect(late.status).toBe(409)
    expect(late.body.error.code).toBe('invitation_closed')
  })

  it('resend mails a new link with a new expiry; the old link stops working', async () => {
    const first = await invite('chartroom.type@harbour.test', 'viewer')
    await db.ds.query('UPDATE invitations SET expires_at = ?, last_sent_at = ? WHERE id = ?', [new Date(Date.now() - DAY_MS), new Date(Date.now() - 8 * DAY_MS), first.id])
    const before = mailbox.fake.messages().length
    const res = await asUser('owner', 'post', `/invitations/${first.id}/resend`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.status).toBe('pending')
    expect(Math.abs(Date.parse(res.body.expiresAt) - Date.now() - 7 * DAY_MS)).toBeLessThan(SAME_REQUEST_SKEW_MS)
    expect(Math.abs(Date.parse(res.body.lastSentAt) - Date.now())).toBeLessThan(SAME_REQUEST_SKEW_MS)
    const mail = await mailbox.waitForMessage((m) => mailbox.fake.messages().indexOf(m) >= before && m.to.includes('chartroom.type@harbour.test'))
    const secret = LINK_PATTERN.exec(mail.text)?.[1]
    expect(secret).toBeDefined()
    expect(secret).not.toBe(first.secret)
    expect((await lookup(first.secret)).status).toBe(404)
    const found = await lookup(secret!)
    expect(found.status).toBe(200)
    expect(found.body.expiresAt).toBe(res.body.expiresAt)
  })

  it('answers 404 for a token that was never issued, and 400 without one', async () => {
    const unknown = await lookup('A'.repeat(43))
    expect(unknown.status).toBe(404)
    expect(unknown.body.error.code).toBe('invalid_invitation')
    const none = await request(rc.app).get('/api/v1/invitations/lookup')
    expect(none.status).toBe(400)
  })
})

describe('members and roles', () => {
  it('lists the members with role, join and last-active times, owners first', async () => {
    const res = await asUser('viewer', 'get', `/teams/${demoTeamId}/members`)
    expect(res.status).toBe(200)
    const byEmail = new Map(res.body.items.map((m: { email: string }) => [m.email, m]))
    expect(res.body.items[0]).toMatchObject({ email: 'owner@example.com', displayName: 'Morwenna Quay', role: 'owner' })
    expect(byEmail.get('editor@example.com')).toMatchObject({ role: 'editor', displayName: 'Tobias Slipway' })
    // Everyone signed in above made requests, so the middleware wrote their last activity.
    const viewer = byEmail.get('viewer@example.com') as { lastActiveAt: string; joinedAt: string; userId: number }
    expect(Date.now() - Date.parse(viewer.lastActiveAt)).toBeLessThan(10 * 60_000)
    expect(viewer.userId).toBe(await userId('viewer@example.com'))
    expect(Number.isNaN(Date.parse(viewer.joinedAt))).toBe(false)
    expect(byEmail.has(OUTSIDER.email)).toBe(false)
    expect((await asUser('outsider', 'get', `/teams/${demoTeamId}/members`)).status).toBe(404)
  })

  it('lets owners change roles; editors and viewers 403, another team’s owner 404, a non-member 404', async () => {
    const id = await makeAccount('harbourmaster@harbour.test', 'Harbour Master')
    await addMember(demoTeamId, id, 'viewer')
    const url = `/teams/${demoTeamId}/members/${id}`
    const promoted = await asUser('owner', 'patch', url, { role: 'editor' })
    expect(promoted.status, JSON.stringify(promoted.body)).toBe(200)
    expect(promoted.body).toMatchObject({ userId: id, role: 'editor', displayName: 'Harbour Master' })
    for (const who of ['editor', 'viewer'] as const) {
      const res = await asUser(who, 'patch', url, { role: 'owner' })
      expect(res.status, who).toBe(403)
    }
    expect((await asUser('outsider', 'patch', url, { role: 'owner' })).status).toBe(404)
    expect((await asUser('owner', 'patch', `/teams/${demoTeamId}/members/${await userId(OUTSIDER.email)}`, { role: 'editor' })).status).toBe(404)
    expect((await asUser('owner', 'patch', url, { role: 'captain' })).status).toBe(400)
    expect((await db.ds.getRepository(MembershipEntity).findOneByOrFail({ teamId: demoTeamId, userId: id })).role).toBe('editor')
  })

  it('never demotes or removes the last owner, not even by themselves', async () => {
    const ownerId = await userId('owner@example.com')
    const url = `/teams/${demoTeamId}/members/${ownerId}`
    for (const res of [await asUser('owner', 'patch', url, { role: 'editor' }), await asUser('owner', 'delete', url)]) {
      expect(res.status).toBe(409)
      expect(res.body.error.code).toBe('last_owner')
    }
    // The outsider is the only owner of the other team: leaving it is refused too.
    const outsiderId = await userId(OUTSIDER.email)
    const leave = await asUser('outsider', 'delete', `/teams/${otherTeamId}/members/${outsiderId}`)
    expect(leave.status).toBe(409)
    expect(leave.body.error.code).toBe('last_owner')

    // With a second owner, the first may step down; then the second is the last one.
    const deputy = await makeAccount('deputy.owner@harbour.test', 'Deputy Owner')
    await addMember(demoTeamId, deputy, 'owner')
    const down = await asUser('owner', 'patch', url, { role: 'editor' })
    expect(down.status).toBe(200)
    expect(down.body.role).toBe('editor')
    const deputyAs = await signIn(rc.app, 'deputy.owner@harbour.test')
    const deputyDown = await deputyAs.agent.patch(`/api/v1/teams/${demoTeamId}/members/${deputy}`).set('X-CSRF-Token', deputyAs.csrf).send({ role: 'viewer' })
    expect(deputyDown.status).toBe(409)
    expect(deputyDown.body.error.code).toBe('last_owner')
    const restored = await deputyAs.agent.patch(`/api/v1${url}`).set('X-CSRF-Token', deputyAs.csrf).send({ role: 'owner' })
    expect(restored.status).toBe(200)
    expect((await asUser('owner', 'delete', `/teams/${demoTeamId}/members/${deputy}`)).status).toBe(204)
    const owners = await db.ds.getRepository(MembershipEntity).findBy({ teamId: demoTeamId, role: 'owner' })
    expect(owners.map((m) => m.userId)).toEqual([ownerId])
  })

  it('lets any member leave; only owners remove others', async () => {
    const id = await makeAccount('deckhand@harbour.test', 'Deck Hand')
    await addMember(demoTeamId, id, 'viewer')
    const deckhand = await signIn(rc.app, 'deckhand@harbour.test')
    const editorId = await userId('editor@example.com')
    const refused = await deckhand.agent.delete(`/api/v1/teams/${demoTeamId}/members/${editorId}`).set('X-CSRF-Token', deckhand.csrf)
    expect(refused.status).toBe(403)
    expect((await asUser('editor', 'delete', `/teams/${demoTeamId}/members/${id}`)).status).toBe(403)
    const left = await deckhand.agent.delete(`/api/v1/teams/${demoTeamId}/members/${id}`).set('X-CSRF-Token', deckhand.csrf)
    expect(left.status).toBe(204)
    expect(await db.ds.getRepository(MembershipEntity).existsBy({ teamId: demoTeamId, userId: id })).toBe(false)
    expect((await deckhand.agent.get(`/api/v1/teams/${demoTeamId}/members`)).status).toBe(404)

    await addMember(demoTeamId, id, 'editor')
    expect((await asUser('owner', 'delete', `/teams/${demoTeamId}/members/${id}`)).status).toBe(204)
    expect((await asUser('owner', 'delete', `/teams/${demoTeamId}/members/${id}`)).status).toBe(404)
  })
})
