import express from 'express'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { errorHandler, type RootcastApp } from '../../server/app'
import { buildTestApp, seedTestData, signIn } from '../helpers/test-app'
import { createTestDatabase, type TestDatabase } from '../helpers/test-db'

let db: TestDatabase
let rc: RootcastApp

beforeAll(async () => {
  db = await createTestDatabase()
  await seedTestData(db.ds)
  rc = buildTestApp(db.ds)
})
afterAll(async () => {
  await rc?.close()
  await db?.drop()
})

describe('errors in the API shape', () => {
  it('answers unknown API routes with 404 not_found', async () => {
    for (const url of ['/api/v1/no-such-thing', '/api/nothing', '/api/v1/projects/1/nope']) {
      const res = await request(rc.app).get(url)
      expect(res.status, url).toBe(404)
      expect(res.body.error.code).toBe('not_found')
      expect(typeof res.body.error.message).toBe('string')
    }
  })

  it('answers malformed JSON with 400 and over-size bodies with 413 limit', async () => {
    const bad = await request(rc.app).post('/api/v1/auth/login').set('Content-Type', 'application/json').send('{"email":')
    expect(bad.status).toBe(400)
    expect(bad.body.error.code).toBe('invalid_json')
    const big = await request(rc.app)
      .post('/api/v1/auth/login')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@b.co', password: 'x'.repeat(2_100_000) }))
    expect(big.status).toBe(413)
    expect(big.body.error.code).toBe('limit')
  })

  it('never sends a stack trace, and a failing request does not stop the server', async () => {
    const logged = vi.spyOn(console, 'error').mockImplementation(() => {})
    const app = express()
    app.get('/sync', () => {
      throw new Error('secret internals at /srv/app.ts:12')
    })
    app.get('/async', async () => {
      await Promise.resolve()
      throw new TypeError('undefined is not a function')
    })
    app.get('/fine', (_req, res) => res.json({ ok: true }))
    app.use(errorHandler)
    for (const url of ['/sync', '/async']) {
      const res = await request(app).get(url)
      expect(res.status).toBe(500)
      expect(res.body).toEqual({ error: { code: 'internal', message: expect.stringMatching(/went wrong/) } })
      expect(res.text).not.toMatch(/secret internals|\.ts:\d+|at /)
    }
    expect((await request(app).get('/fine')).body).toEqual({ ok: true })
    expect(logged).toHaveBeenCalledTimes(2)
    logged.mockRestore()
  })

  it('keeps answering after bad requests on the real app', async () => {
    const { agent } = await signIn(rc.app, 'viewer@example.com')
    await agent.get('/api/v1/projects/999999')
    await agent.post('/api/v1/teams/abc/projects').send('garbage')
    const me = await agent.get('/api/v1/auth/me')
    expect(me.status).toBe(200)
  })
})
