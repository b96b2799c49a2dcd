import { createHash } from 'node:crypto'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PASSWORD_RESET_ACCEPTED_MESSAGE, PASSWORD_RESET_LIFETIME_MINUTES } from '../../shared/api/account'
import type { RootcastApp } from '../../server/app'
import { PasswordResetEntity } from '../../server/entities/password-reset.entity'
import { UserEntity } from '../../server/entities/user.entity'
import { hashPassword } from '../../server/services/auth.service'
import type { Mailer, MailMessage } from '../../server/services/mail.service'
import { createToken } from '../../server/services/tokens.service'
import { buildTestApp, seedTestData, signIn, TEST_PASSWORD, testConfig, type SignedIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'
import { startTestMailbox, type TestMailbox } from '../helpers/test-mail'

let db: TestDatabase
let rc: RootcastApp
let mailbox: TestMailbox
/** Every message the app handed to its mailer, in order: what was sent, not only what arrived. */
const handed: MailMessage[] = []

/** Invented new passwords of at least ten characters. */
const NEW_PASSWORD = 'quay-crane-lantern-41'
const OTHER_PASSWORD = 'breakwater-signal-08'
const MINUTE_MS = 60_000
/**
 * expiresAt is Date.now() + 60 min in the service, createdAt MariaDB's CURRENT_TIMESTAMP(3)
 * a moment later in the same request on the same machine: they differ by the request's own
 * duration, far below this.
 */
const SAME_REQUEST_SKEW_MS = 5_000
/** The reset link: the configured public URL, the path, and 32 random bytes in base64url (43 characters). */
const RESET_LINK = /(\S+)\/reset-password\?token=([A-Za-z0-9_-]{43})(?=\s|$)/
const PUBLIC_URL = testConfig().publicUrl

const api = (path: string) => `/api/v1${path}`
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex')

/** A person of their own per test, so password changes do not leak between tests. */
async function makeUser(email: string, displayName = 'Harbour Test Person'): Promise<number> {
  const saved = await db.ds.getRepository(UserEntity).save({ email, displayName, passwordHash: await hashPassword(TEST_PASSWORD) })
  return saved.id
}
async function signInStatus(email: string, password: string): Promise<number> {
  return (await request(rc.app).post(api('/auth/login')).send({ email, password })).status
}
const meStatus = async (s: SignedIn) => (await s.agent.get(api('/auth/me'))).status
const post = (s: SignedIn, path: string, body: object = {}) => s.agent.post(api(path)).set('X-CSRF-Token', s.csrf).send(body)
const askReset = (email: string) => request(rc.app).post(api('/auth/password-reset')).send({ email })
const confirmReset = (token: string, password: string) =>
  request(rc.app).post(api('/auth/password-reset/confirm')).send({ token, password })

/** Asks for a reset of a known address and reads the token from the mail that arrives. */
async function resetTokenFor(email: string): Promise<string> {
  const res = await askReset(email)
  expect(res.status, JSON.stringify(res.body)).toBe(202)
  const mail = await mailbox.waitForMessage((m) => m.to.includes(email) && !usedMailIds.has(m.id))
  usedMailIds.add(mail.id)
  const match = RESET_LINK.exec(mail.text)
  if (!match) throw new Error(`no reset link in the mail to ${email}: ${mail.text}`)
  return match[2]
}
const usedMailIds = new Set<string>()

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  mailbox = await startTestMailbox()
  const recording: Mailer = {
    send: (message) => {
      handed.push(message)
      return mailbox.mailer.send(message)
    },
    close: () => undefined,
  }
  rc = buildTestApp(db.ds, { mailer: recording })
})
afterAll(async () => {
  await rc?.close()
  await mailbox?.stop()
  await db?.drop()
})

describe('display name', () => {
  it('changes the display name, trimmed, and answers the session as it now is', async () => {
    await makeUser('name.change@harbour.test', 'Ines Ortega')
    const me = await signIn(rc.app, 'name.change@harbour.test')
    const res = await me.agent.patch(api('/auth/me')).set('X-CSRF-Token', me.csrf).send({ displayName: '  Ines O. Ortega  ' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.user.displayName).toBe('Ines O. Ortega')
    expect(res.body.user.email).toBe('name.change@harbour.test')
    expect(res.body.csrfToken).toBe(me.csrf)
    expect((await me.agent.get(api('/auth/me'))).body.user.displayName).toBe('Ines O. Ortega')
    const row = await db.ds.getRepository(UserEntity).findOneByOrFail({ email: 'name.change@harbour.test' })
    expect(row.displayName).toBe('Ines O. Ortega')
  })

  it('refuses an empty or over-long name, and a change without the CSRF token', async () => {
    await makeUser('name.refused@harbour.test', 'Tomas Brenner')
    const me = await signIn(rc.app, 'name.refused@harbour.test')
    for (const displayName of ['   ', 'x'.repeat(81)]) {
      const res = await me.agent.patch(api('/auth/me')).set('X-CSRF-Token', me.csrf).send({ displayName })
      expect(res.status, displayName).toBe(400)
      expect(res.body.error.code).toBe('validation')
    }
    const exactly80 = await me.agent.patch(api('/auth/me')).set('X-CSRF-Token', me.csrf).send({ displayName: 'y'.repeat(80) })
    expect(exactly80.status).toBe(200)
    const noCsrf = await me.agent.patch(api('/auth/me')).send({ displayName: 'Riding along' })
    expect(noCsrf.status).toBe(403)
    expect(noCsrf.body.error.code).toBe('csrf')
    expect((await me.agent.get(api('/auth/me'))).body.user.displayName).toBe('y'.repeat(80))
    expect((await request(rc.app).patch(api('/auth/me')).send({ displayName: 'Nobody' })).status).toBe(401)
  })
})

describe('password change', () => {
  it('refuses a wrong current password and a short new one, and changes nothing then', async () => {
    await makeUser('pw.wrong@harbour.test')
    const me = await signIn(rc.app, 'pw.wrong@harbour.test')
    const wrong = await post(me, '/auth/password', { currentPassword: 'not-my-password', newPassword: NEW_PASSWORD })
    expect(wrong.status).toBe(400)
    expect(wrong.body.error.code).toBe('wrong_password')
    const short = await post(me, '/auth/password', { currentPassword: TEST_PASSWORD, newPassword: '123456789' })
    expect(short.status).toBe(400)
    expect(short.body.error.code).toBe('validation')
    expect(await signInStatus('pw.wrong@harbour.test', TEST_PASSWORD)).toBe(200)
    expect(await signInStatus('pw.wrong@harbour.test', NEW_PASSWORD)).toBe(401)
  })

  it('sets the new password and signs out the other sessions, keeping this one', async () => {
    await makeUser('pw.change@harbour.test')
    const here = await signIn(rc.app, 'pw.change@harbour.test')
    const elsewhere = await signIn(rc.app, 'pw.change@harbour.test')
    const bystander = await signIn(rc.app, 'editor@example.com')
    const res = await post(here, '/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD })
    expect(res.status, JSON.stringify(res.body)).toBe(204)
    expect(await meStatus(elsewhere)).toBe(401)
    expect(await meStatus(here)).toBe(200)
    expect(await meStatus(bystander)).toBe(200)
    // This session still writes: its CSRF token is unchanged.
    expect((await post(here, '/auth/sessions/revoke-others')).body).toEqual({ revoked: 0 })
    expect(await signInStatus('pw.change@harbour.test', TEST_PASSWORD)).toBe(401)
    expect(await signInStatus('pw.change@harbour.test', NEW_PASSWORD)).toBe(200)
  })

  it('answers 429 after repeated wrong current passwords, as sign-in does', async () => {
    await makeUser('pw.limit@harbour.test')
    const me = await signIn(rc.app, 'pw.limit@harbour.test')
    const { maxFailures } = testConfig().login
    for (let i = 0; i < maxFailures; i++) {
      const res = await post(me, '/auth/password', { currentPassword: `guess-${i}-harbour`, newPassword: NEW_PASSWORD })
      expect(res.status, `attempt ${i + 1}`).toBe(400)
    }
    const limited = await post(me, '/auth/password', { currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD })
    expect(limited.status).toBe(429)
    expect(limited.body.error.code).toBe('rate_limited')
    expect(await signInStatus('pw.limit@harbour.test', TEST_PASSWORD)).toBe(200)
  })

  it('needs a cookie session: a token is refused 403 session_required', async () => {
    const userId = await makeUser('pw.token@harbour.test')
    const { secret } = await createToken(db.ds, userId, { name: 'Pipeline', expiresInDays: 5 })
    const res = await request(rc.app).post(api('/auth/password')).set('Authorization', `Bearer ${secret}`)
      .send({ currentPassword: TEST_PASSWORD, newPassword: NEW_PASSWORD })
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('session_required')
    const revoke = await request(rc.app).post(api('/auth/sessions/revoke-others')).set('Authorization', `Bearer ${secret}`)
    expect(revoke.status).toBe(403)
    expect(await signInStatus('pw.token@harbour.test', TEST_PASSWORD)).toBe(200)
  })
})

describe('signing out other sessions', () => {
  it('ends the person’s other sessions only, counts them, and keeps this one', async () => {
    const userId = await makeUser('sessions@harbour.test')
    const here = await signIn(rc.app, 'sessions@harbour.test')
    const phone = await signIn(rc.app, 'sessions@harbour.test')
    const laptop = await signIn(rc.app, 'sessions@harbour.test')
    const bystander = await signIn(rc.app, 'viewer@example.com')
    const countRows = async () =>
      Number(((await db.ds.query("SELECT COUNT(*) AS n FROM sessions WHERE JSON_VALUE(data, '$.userId') = ?", [String(userId)])) as Array<{ n: number }>)[0].n)
    expect(await countRows()).toBe(3)

    const res = await post(here, '/auth/sessions/revoke-others')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ revoked: 2 })
    expect(await meStatus(phone)).toBe(401)
    expect(await meStatus(laptop)).toBe(401)
    expect(await meStatus(here)).toBe(200)
    expect(await meStatus(bystander)).toBe(200)
    expect(await countRows()).toBe(1)
    expect((await post(here, '/auth/sessions/revoke-others')).body).toEqual({ revoked: 0 })
    expect((await here.agent.post(api('/auth/sessions/revoke-others'))).status).toBe(403)
  })
})

describe('password reset', () => {
  it('gives the same answer for a known and an unknown address, and mails only the known one', async () => {
    await makeUser('reset.known@harbour.test')
    const before = handed.length
    const unknown = await askReset('nobody.here@harbour.test')
    const known = await askReset('  Reset.Known@Harbour.test ')
    expect(unknown.status).toBe(202)
    expect(known.status).toBe(202)
    expect(known.body).toEqual(unknown.body)
    expect(known.body).toEqual({ message: PASSWORD_RESET_ACCEPTED_MESSAGE })
    expect(known.headers['content-type']).toBe(unknown.headers['content-type'])

    const mail = await mailbox.waitForMessage((m) => m.to.includes('reset.known@harbour.test'))
    usedMailIds.add(mail.id)
    expect(mail.subject).toBe('Rootcast: set a new password')
    const match = RESET_LINK.exec(mail.text)
    expect(match, mail.text).not.toBeNull()
    expect(match![1]).toBe(PUBLIC_URL)
    const sent = handed.slice(before)
    expect(sent.map((m) => m.to)).toEqual([['reset.known@harbour.test']])
    expect(mailbox.fake.messages().some((m) => m.to.includes('nobody.here@harbour.test'))).toBe(false)

    // Only the SHA-256 of the token is stored, with a 60-minute life.
    const token = match![2]
    const rows = await db.ds.getRepository(PasswordResetEntity).find({ where: { tokenHash: sha256(token) } })
    expect(rows).toHaveLength(1)
    const lifetime = rows[0].expiresAt.getTime() - rows[0].createdAt.getTime()
    expect(Math.abs(lifetime - PASSWORD_RESET_LIFETIME_MINUTES * MINUTE_MS)).toBeLessThan(SAME_REQUEST_SKEW_MS)
    const raw = JSON.stringify(await db.ds.query('SELECT * FROM password_resets'))
    expect(raw).not.toContain(token)
  })

  it('sets the password once: the new one signs in, the old does not, every session ends, the link is then refused', async () => {
    await makeUser('reset.once@harbour.test')
    const sessionA = await signIn(rc.app, 'reset.once@harbour.test')
    const sessionB = await signIn(rc.app, 'reset.once@harbour.test')
    const token = await resetTokenFor('reset.once@harbour.test')

    const done = await confirmReset(token, NEW_PASSWORD)
    expect(done.status, JSON.stringify(done.body)).toBe(204)
    expect(await meStatus(sessionA)).toBe(401)
    expect(await meStatus(sessionB)).toBe(401)
    expect(await signInStatus('reset.once@harbour.test', TEST_PASSWORD)).toBe(401)
    expect(await signInStatus('reset.once@harbour.test', NEW_PASSWORD)).toBe(200)

    const again = await confirmReset(token, OTHER_PASSWORD)
    expect(again.status).toBe(400)
    expect(again.body.error.code).toBe('invalid_token')
    expect(await signInStatus('reset.once@harbour.test', NEW_PASSWORD)).toBe(200)
    expect(await signInStatus('reset.once@harbour.test', OTHER_PASSWORD)).toBe(401)
  })

  it('ends an older open link of the same person once a reset succeeds', async () => {
    await makeUser('reset.two@harbour.test')
    const first = await resetTokenFor('reset.two@harbour.test')
    const second = await resetTokenFor('reset.two@harbour.test')
    expect(first).not.toBe(second)
    expect((await confirmReset(second, NEW_PASSWORD)).status).toBe(204)
    const old = await confirmReset(first, OTHER_PASSWORD)
    expect(old.status).toBe(400)
    expect(old.body.error.code).toBe('invalid_token')
    expect(await signInStatus('reset.two@harbour.test', NEW_PASSWORD)).toBe(200)
  })

  it('refuses an expired link and an unknown token, and keeps the password', async () => {
    await makeUser('reset.expired@harbour.test')
    const token = await resetTokenFor('reset.expired@harbour.test')
    await db.ds.query('UPDATE password_resets SET expires_at = ? WHERE token_hash = ?', [new Date(Date.now() - MINUTE_MS), sha256(token)])
    const expired = await confirmReset(token, NEW_PASSWORD)
    expect(expired.status).toBe(400)
    expect(expired.body.error.code).toBe('invalid_token')
    const unknown = await confirmReset('A'.repeat(43), NEW_PASSWORD)
    expect(unknown.status).toBe(400)
    expect(unknown.body.error.code).toBe('invalid_token')
    expect(await signInStatus('reset.expired@harbour.test', TEST_PASSWORD)).toBe(200)
    expect(await signInStatus('reset.expired@harbour.test', NEW_PASSWORD)).toBe(401)
  })

  it('refuses a short new password with a valid link and leaves the link usable', async () => {
    await makeUser('reset.short@harbour.test')
    const token = await resetTokenFor('reset.short@harbour.test')
    const short = await confirmReset(token, 'too-short')
    expect(short.status).toBe(400)
    expect(short.body.error.code).toBe('validation')
    expect((await confirmReset(token, NEW_PASSWORD)).status).toBe(204)
  })

  it('limits requests per address and client, known or not, with the same 429', async () => {
    await makeUser('reset.limit@harbour.test')
    const { maxFailures } = testConfig().login
    const answers: Record<string, number[]> = {}
    for (const email of ['reset.limit@harbour.test', 'reset.limit.unknown@harbour.test']) {
      answers[email] = []
      for (let i = 0; i <= maxFailures; i++) answers[email].push((await askReset(email)).status)
    }
    const expected = [...Array<number>(maxFailures).fill(202), 429]
    expect(answers['reset.limit@harbour.test']).toEqual(expected)
    expect(answers['reset.limit.unknown@harbour.test']).toEqual(expected)
    // Another address from the same client is not held back.
    expect((await askReset('reset.limit.other@harbour.test')).status).toBe(202)
  })

  it('refuses a malformed address with 400 and mails nothing', async () => {
    const before = handed.length
    const res = await askReset('not-an-address')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('validation')
    expect(handed.length).toBe(before)
  })
})
