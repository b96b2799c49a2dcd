import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RootcastApp } from '../../server/app'
import { UserEntity } from '../../server/entities/user.entity'
import { buildTestApp, seedTestData, signIn, TEST_PASSWORD } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  rc = buildTestApp(db.ds, { env: { ROOTCAST_LOGIN_MAX_FAILURES: '3' } })
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

describe('sign-in', () => {
  it('signs in with the right password and reports the teams and roles', async () => {
    const res = await request(rc.app).post('/api/v1/auth/login').send({ email: 'Editor@Example.com ', password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ email: 'editor@example.com', displayName: 'Tobias Slipway' })
    expect(res.body.teams).toEqual([{ id: expect.any(Number), name: 'Harbour Type Workshop', role: 'editor' }])
    expect(res.body.csrfToken).toMatch(/^[A-Za-z0-9_-]{20,}$/)
    const cookie = String(res.headers['set-cookie'])
    expect(cookie).toMatch(/rootcast\.sid=/)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })

  it('refuses a wrong password and an unknown address with the same 401', async () => {
    const wrong = await request(rc.app).post('/api/v1/auth/login').send({ email: 'owner@example.com', password: 'not-the-password' })
    const unknown = await request(rc.app).post('/api/v1/auth/login').send({ email: 'nobody@example.com', password: 'whatever-1' })
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401)
      expect(res.body.error.code).toBe('invalid_credentials')
      expect(res.body.error.message).toMatch(/do not match/)
    }
  })

  it('rejects malformed sign-in bodies with 400 validation', async () => {
    const res = await request(rc.app).post('/api/v1/auth/login').send({ email: 'not-an-address', password: '' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('validation')
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['body.email', 'body.password'])
  })

  it('rate-limits repeated failures for one address, while other addresses still sign in', async () => {
    const email = 'viewer@example.com'
    const codes: number[] = []
    for (let i = 0; i < 4; i++) {
      const res = await request(rc.app).post('/api/v1/auth/login').send({ email, password: `wrong-${i}` })
      codes.push(res.status)
    }
    expect(codes).toEqual([401, 401, 401, 429])
    const blocked = await request(rc.app).post('/api/v1/auth/login').send({ email, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(blocked.body.error.code).toBe('rate_limited')
    const other = await request(rc.app).post('/api/v1/auth/login').send({ email: 'owner@example.com', password: TEST_PASSWORD })
    expect(other.status).toBe(200)
  })

  it('stores passwords as bcrypt hashes only', async () => {
    const users = await db.ds.getRepository(UserEntity).find()
    expect(users.length).toBeGreaterThanOrEqual(4)
    for (const u of users) {
      expect(u.passwordHash).toMatch(/^\$2[aby]\$\d\d\$/)
      expect(u.passwordHash).not.toContain(TEST_PASSWORD)
    }
  })
})

describe('sessions', () => {
  it('answers /auth/me for a session and 401 without one', async () => {
    const { agent } = await signIn(rc.app, 'owner@example.com')
    const me = await agent.get('/api/v1/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe('owner@example.com')
    expect(me.body.teams[0].role).toBe('owner')
    const anon = await request(rc.app).get('/api/v1/auth/me')
    expect(anon.status).toBe(401)
    expect(anon.body.error.code).toBe('unauthenticated')
  })

  it('keeps the session in MariaDB, so it survives an app restart', async () => {
    const login = await request(rc.app).post('/api/v1/auth/login').send({ email: 'editor@example.com', password: TEST_PASSWORD })
    const cookie = login.headers['set-cookie'] as unknown as string[]
    const [{ n }] = (await db.ds.query('SELECT COUNT(*) AS n FROM sessions')) as Array<{ n: number }>
    expect(Number(n)).toBeGreaterThan(0)
    const second = buildTestApp(db.ds)
    try {
      const me = await request(second.app).get('/api/v1/auth/me').set('Cookie', cookie)
      expect(me.status).toBe(200)
      expect(me.body.user.email).toBe('editor@example.com')
      expect(me.body.csrfToken).toBe(login.body.csrfToken)
    } finally {
      await second.close()
    }
  })

  it('signs out: the cookie no longer works and the session row is gone', async () => {
    const { agent, csrf } = await signIn(rc.app, 'editor@example.com')
    const refused = await agent.post('/api/v1/auth/logout')
    expect(refused.status).toBe(403)
    expect(refused.body.error.code).toBe('csrf')
    const out = await agent.post('/api/v1/auth/logout').set('X-CSRF-Token', csrf)
    expect(out.status).toBe(204)
    expect((await agent.get('/api/v1/auth/me')).status).toBe(401)
  })

  it('gives a new session id at sign-in (no session fixation)', async () => {
    const sid = (res: request.Response) => String(res.headers['set-cookie']).match(/rootcast\.sid=([^;]+)/)?.[1]
    const body = { email: 'owner@example.com', password: TEST_PASSWORD }
    const first = await request(rc.app).post('/api/v1/auth/login').send(body)
    const second = await request(rc.app).post('/api/v1/auth/login').set('Cookie', `rootcast.sid=${sid(first)}`).send(body)
    expect(sid(first)).toBeTruthy()
    expect(sid(second)).toBeTruthy()
    expect(sid(second)).not.toBe(sid(first))
  })

  it('refuses an Authorization header that carries no valid token', async () => {
    const res = await request(rc.app).get('/api/v1/auth/me').set('Authorization', 'Bearer rc_not_a_real_token')
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('invalid_token')
  })
})

describe('headers', () => {
  it('sends helmet headers with a Content-Security-Policy', async () => {
    const res = await request(rc.app).get('/api/v1/health')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ status: 'ok', database: expect.stringMatching(/MariaDB/) })
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/)
    expect(res.headers['content-security-policy']).toMatch(/script-src 'self'/)
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['x-powered-by']).toBeUndefined()
  })
})
